import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { EChartsCoreOption } from 'echarts/core';
import { SIZING_CAUTIONS_TITLE } from '@shared/reports/cautions';
import { reportChartOption } from '@shared/reports/report-chart';
import type { ReportView } from '@shared/reports/report-schemas';
import { provideCharts } from '../../charts/provide-charts';

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
  protected readonly cautionsTitle = SIZING_CAUTIONS_TITLE;
  protected readonly chart = computed(() => reportChartOption(this.view(), { compact: false }) as EChartsCoreOption);
  protected readonly projectLine = computed(() => {
    const p = this.view().project;
    return [p.clientName, p.siteAddress].filter((x) => x).join(' · ');
  });
}
