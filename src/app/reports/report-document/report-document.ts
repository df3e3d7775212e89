import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { EChartsCoreOption } from 'echarts/core';
import { optionMarks, reportChartOption } from '@shared/reports/report-chart';
import type { ReportView } from '@shared/reports/report-schemas';
import { provideCharts } from '../../charts/provide-charts';
import { compactScreen } from '../../core/compact-screen';

/** The report as the homeowner sees it (the public page and the designer's preview show this same component). */
@Component({
  selector: 'app-report-document',
  imports: [DatePipe, NgxEchartsDirective],
  providers: [provideCharts()],
  templateUrl: './report-document.html',
  styleUrl: './report-document.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportDocument {
  readonly view = input.required<ReportView>();
  /** Phone width: fewer axis labels and smaller type, so that a 390 px chart stays readable. */
  private readonly compact = compactScreen();
  protected readonly chart = computed(
    () => reportChartOption(this.view(), { compact: this.compact() }) as EChartsCoreOption,
  );
  protected readonly marks = computed(() => optionMarks(this.view().options.length));
  protected readonly chartLabel = computed(
    () =>
      `Total cost over the years compared and hours a year the house could get cooler than set, for units sized for milder to colder nights; options ${this.view()
        .options.map((_, k) => 'ABC'[k] ?? '')
        .join(', ')} marked`,
  );
  protected readonly projectLine = computed(() => {
    const p = this.view().project;
    return [p.clientName, p.siteAddress].filter((x) => x).join(' · ');
  });
}
