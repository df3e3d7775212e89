import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { ClimateSite, RecentYears } from '@shared/climate/climate-schemas';
import { formatQuantity, fromSi, unitLabel, type UnitSystem } from '@shared/units/units';
import { CHART_TEXT, COLD, EMBER, INK } from '../../charts/chart-theme';
import { provideCharts } from '../../charts/provide-charts';
import { apiErrorMessage } from '../../core/api-errors';
import { ClimateSitesApi } from '../climate-sites-api';
import { type ChartOption } from '../../charts/chart-option';

/**
 * A site's climate basis: for a site with published values, an hour-by-hour record estimated from a
 * reference site's record; for any site with a record, the design values of the whole record beside
 * its latest 10 and 15 years, and the trend of the coldest hour of each year.
 */
@Component({
  selector: 'app-climate-basis-panel',
  imports: [
    DecimalPipe,
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    NgxEchartsDirective,
  ],
  providers: [provideCharts()],
  templateUrl: './climate-basis-panel.html',
  styleUrl: './climate-basis-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateBasisPanel {
  // services
  private readonly api = inject(ClimateSitesApi);

  // inputs
  readonly site = input.required<ClimateSite>();
  readonly unitSystem = input.required<UnitSystem>();
  readonly canWrite = input(false);
  /** The site after its record was estimated. */
  readonly estimated = output<ClimateSite>();

  /** The possible references: read only where an estimate can be made. */
  protected readonly sites = this.api.listResource(() => this.site().sourceKind === 'published' && this.canWrite());
  protected readonly references = computed(() => {
    const all = this.sites.hasValue() ? this.sites.value() : [];
    return all.filter((s) => s.sourceKind === 'hourly' && s.qualifyingYearCount !== null && s.id !== this.site().id);
  });
  protected readonly referenceId = signal<string | null>(null);
  protected readonly estimating = signal(false);
  protected readonly estimateError = signal<string | null>(null);

  protected readonly recent = this.api.recentYearsResource(() => (this.site().computed ? this.site().id : undefined));
  protected readonly recentValue = computed<RecentYears | null>(() =>
    this.recent.hasValue() ? this.recent.value() : null,
  );

  protected temp(c: number | null | undefined): string {
    return c === null || c === undefined ? '—' : formatQuantity('temperature', c, this.unitSystem());
  }

  protected degreeDays(dd: number): string {
    return formatQuantity('degreeDays', dd, this.unitSystem());
  }

  protected readonly windowLabels = computed(() =>
    (this.recentValue()?.windows ?? []).map((w) => ({
      window: w,
      heading: w.latestYears === null ? `Whole record` : `Latest ${w.latestYears} years`,
      span: `${w.firstYear}–${w.lastYear}, ${w.qualifyingYearCount} years`,
    })),
  );

  protected readonly slopeText = computed(() => {
    const r = this.recentValue();
    const slope = r?.trend.senSlopeKPerDecade;
    if (!r || slope === null || slope === undefined) return null;
    const perDecade = this.unitSystem() === 'SI' ? slope : slope * 1.8;
    return `${perDecade >= 0 ? '+' : '−'}${Math.abs(perDecade).toFixed(2)} ${this.unitSystem() === 'SI' ? 'K' : '°F'} per decade`;
  });

  protected readonly chartOptions = computed<ChartOption>(() => {
    const r = this.recentValue();
    const system = this.unitSystem();
    const unit = unitLabel('temperature', system);
    const t = (c: number) => Math.round(fromSi('temperature', c, system) * 10) / 10;
    const annual = r?.trend.annual ?? [];
    const slope = r?.trend.senSlopeKPerDecade ?? null;
    // The Theil–Sen line passes through the median of (year, minimum) offsets: intercept = median(y − b·x).
    let line: [number, number][] = [];
    if (slope !== null && annual.length >= 2) {
      const b = slope / 10;
      const offsets = annual.map((a) => a.minC - b * a.year).sort((x, y) => x - y);
      const mid = offsets.length >> 1;
      const a0 = offsets.length % 2 ? (offsets[mid] ?? 0) : ((offsets[mid - 1] ?? 0) + (offsets[mid] ?? 0)) / 2;
      const first = annual[0]?.year ?? 0;
      const last = annual[annual.length - 1]?.year ?? 0;
      line = [
        [first, t(a0 + b * first)],
        [last, t(a0 + b * last)],
      ];
    }
    return {
      animation: false,
      textStyle: CHART_TEXT,
      grid: { left: 56, right: 16, top: 40, bottom: 44 },
      legend: { top: 0, data: ['Coldest hour', '99.6 % value of the year', 'Trend of the coldest hour'] },
      tooltip: { trigger: 'axis' },
      xAxis: {
        type: 'value',
        name: 'Year',
        nameLocation: 'middle',
        nameGap: 28,
        min: 'dataMin',
        max: 'dataMax',
        minInterval: 1,
        axisLabel: { formatter: (v: number) => String(v) },
      },
      yAxis: { type: 'value', name: unit, nameLocation: 'end', scale: true },
      series: [
        {
          name: 'Coldest hour',
          type: 'line',
          symbol: 'circle',
          symbolSize: 8,
          lineStyle: { width: 0 },
          itemStyle: { color: COLD },
          data: annual.map((a) => [a.year, t(a.minC)]),
        },
        {
          name: '99.6 % value of the year',
          type: 'line',
          symbol: 'circle',
          symbolSize: 5,
          lineStyle: { color: INK, width: 1.5 },
          itemStyle: { color: INK },
          data: annual.map((a) => [a.year, t(a.db99_6C)]),
        },
        {
          name: 'Trend of the coldest hour',
          type: 'line',
          symbol: 'none',
          lineStyle: { color: EMBER, width: 2, type: 'dashed' },
          itemStyle: { color: EMBER },
          data: line,
        },
      ],
    };
  });

  protected readonly chartSummary = computed(() => this.recentValue()?.trend.sentence ?? '');

  protected async estimate(): Promise<void> {
    const referenceId = this.referenceId();
    if (!referenceId) {
      this.estimateError.set('Choose a site with an hourly record as the reference.');
      return;
    }
    this.estimating.set(true);
    this.estimateError.set(null);
    try {
      const site = await this.api.estimate(this.site().id, referenceId);
      this.estimated.emit(site);
      this.recent.reload();
    } catch (err) {
      this.estimateError.set(apiErrorMessage(err));
    } finally {
      this.estimating.set(false);
    }
  }
}
