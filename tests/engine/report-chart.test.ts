/**
 * The report chart's legend names only what a reader can see: the band's invisible lower edge (a
 * stacking device, docs/methods.md#uncertainty-band) must not appear as an entry of its own.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { reportChartOption } from '../../shared/reports/report-chart';
import type { ReportView } from '../../shared/reports/report-schemas';

function view(withBand: boolean): ReportView {
  const rows = [-10, -15, -20].map((t, i) => ({
    t,
    lifeCycleCost: 20_000 + i * 500,
    unmetHours: 10 - i * 5,
    unmetLow: withBand ? 8 - i * 4 : null,
    unmetHigh: withBand ? 14 - i * 6 : null,
  }));
  return {
    chart: { rows, points: [{ t: -15, label: 'A' }], temperatureUnit: '°C', currency: 'USD' },
  } as unknown as ReportView;
}

describe('report chart legend', () => {
  for (const compact of [false, true]) {
    it(`lists the cost, the hours and the band, and no helper series (${compact ? 'phone' : 'page'})`, () => {
      const option = reportChartOption(view(true), { compact });
      const legend = (option['legend'] as { data: string[] }).data;
      const series = (option['series'] as { name: string }[]).map((s) => s.name);
      assert.equal(legend.length, 3);
      assert.ok(!legend.includes('band-low'));
      for (const name of legend) assert.ok(series.includes(name), `the legend entry "${name}" names a drawn series`);
      assert.ok(series.includes('band-low'), 'the band still has its lower edge to stack on');
    });
  }

  it('leaves the band out of the legend when there is no band', () => {
    const option = reportChartOption(view(false), { compact: false });
    assert.deepEqual((option['legend'] as { data: string[] }).data, [
      'Total cost over the years compared',
      'Hours a year cooler than you set it',
    ]);
  });
});
