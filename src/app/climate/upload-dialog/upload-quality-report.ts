import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ClimateUpload } from '@shared/climate/climate-schemas';
import { formatQuantity, type UnitSystem } from '@shared/units/units';
import { SERIES_FIELD_LABELS, hoursPerYear, seriesValueLabel, utcHourLabel, yearsLabel } from '../climate-format';

/** The data-quality report of an upload that is checked but not yet stored. */
@Component({
  selector: 'app-upload-quality-report',
  imports: [DecimalPipe, PercentPipe, MatIconModule],
  templateUrl: './upload-quality-report.html',
  styleUrl: './upload-quality-report.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UploadQualityReport {
  readonly upload = input.required<ClimateUpload>();
  readonly unitSystem = input.required<UnitSystem>();

  protected readonly hours99_6 = hoursPerYear(0.4);
  protected readonly hours99 = hoursPerYear(1);

  protected readonly quality = computed(() => this.upload().quality);
  protected readonly span = computed(() => {
    const years = this.quality().yearsFound;
    return years.length ? yearsLabel(years[0] ?? null, years.at(-1) ?? null, null) : '—';
  });
  protected readonly preview = computed(() => {
    const p = this.upload().preview;
    const system = this.unitSystem();
    return p
      ? {
          db99_6: formatQuantity('temperature', p.heating.db99_6, system),
          db99: formatQuantity('temperature', p.heating.db99, system),
        }
      : null;
  });
  protected readonly gapText = computed(() => {
    const gaps = this.quality().gaps;
    if (gaps.count === 0) return 'No gaps of 6 hours or more.';
    const count = `${gaps.count.toLocaleString('en-US')} gap${gaps.count === 1 ? '' : 's'} of 6 hours or more`;
    const longest = gaps.longest;
    return longest
      ? `${count}; the longest is ${longest.hours.toLocaleString('en-US')} hours from ${utcHourLabel(longest.start)}.`
      : `${count}.`;
  });
  protected readonly outOfRange = computed(() => {
    const system = this.unitSystem();
    const o = this.quality().outOfRange;
    return {
      count: o.count,
      byField: Object.entries(o.byField)
        .filter(([, n]) => n > 0)
        .map(([field, n]) => `${SERIES_FIELD_LABELS[field]?.label ?? field}: ${n}`)
        .join(' · '),
      first: o.first.map((v) => ({
        time: utcHourLabel(v.time),
        field: SERIES_FIELD_LABELS[v.field]?.label ?? v.field,
        value: seriesValueLabel(v.field, v.value, system),
      })),
    };
  });
}
