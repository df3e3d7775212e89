import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { aSweepAnswer } from './testing/scenario-fixtures';
import { capacityAtC, comparisonRows, defaultIndex, ladderRows, loadDurationTable, nearestIndex, sentenceFor, tradeoffChart } from './tradeoff-model';

describe('trade-off model', () => {
  const answer = aSweepAnswer();

  it('writes the ladder in the user’s units, with "None large enough" for a rung without a unit', () => {
    const si = ladderRows(answer, 'SI');
    expect(si.map((r) => r.temperature)).toEqual(['−17.0 °C', '−20.5 °C', '−24.0 °C', '−32.0 °C']);
    expect(si[0]?.unit).toBe('Furnace 9 kW');
    expect(si[0]?.installedPrice).toBe('$4,000.00');
    expect(si[0]?.designLoad).toBe('8.8 kW');
    expect(si[0]?.unmetHours).toBe('12');
    // −17 °C = 1.4 °F; 1.8 K = 3.24 °F shown to 0.1.
    const ip = ladderRows(answer, 'IP');
    expect(ip[0]?.temperature).toBe('1 °F');
    expect(ip[0]?.drop).toBe('3.2 °F');
    expect(si[0]?.lowestIndoor).toBe('19.2 °C');
    const none = ladderRows(aSweepAnswer({ rows: [{ ...answer.rows[0]!, selectedOptionId: null, installedPrice: null }] }), 'SI');
    expect(none[0]?.unit).toBe('None large enough');
    expect(none[0]?.installedPrice).toBe('—');
  });

  it('reads the load-duration chart out as a table: load at 1, 10, 50 … hours a year against the chosen unit', () => {
    // Fixture points (hours a year at or above, load, outdoor): 1 h 11.5 kW −30 °C; 20 h 9.2 kW −19 °C;
    // 2,000 h 4.0 kW 0 °C; 5,000 h 500 W 15 °C. The 99 % rung installs the flat 9 kW furnace.
    const mild = loadDurationTable(answer, 0, 'SI');
    expect(mild.map((r) => r.hours)).toEqual(['1.0', '20', '2,000', '5,000']);
    expect(mild.map((r) => r.load)).toEqual(['11.5 kW', '9.2 kW', '4.0 kW', '500 W']);
    expect(mild.map((r) => r.outdoor)).toEqual(['−30.0 °C', '−19.0 °C', '0.0 °C', '15.0 °C']);
    expect(mild.map((r) => r.capacity)).toEqual(['9.0 kW', '9.0 kW', '9.0 kW', '9.0 kW']);
    expect(mild.map((r) => r.keepsUp)).toEqual(['No', 'No', 'Yes', 'Yes']);
    // The 50-year rung installs the 12 kW furnace, which meets every hour.
    expect(loadDurationTable(answer, 3, 'SI').map((r) => r.keepsUp)).toEqual(['Yes', 'Yes', 'Yes', 'Yes']);
    // 11,500 W × 3.41214 = 39,240 Btu/h, shown to the 100.
    expect(loadDurationTable(answer, 0, 'IP')[0]?.load).toBe('39,200 Btu/h');
    expect(loadDurationTable(aSweepAnswer({ loadDuration: null }), 0, 'SI')).toEqual([]);
  });

  it('opens on the 99.6 % rung when there is one, else on the first named rung; finds the nearest rung to a temperature', () => {
    expect(defaultIndex(answer.rows)).toBe(0); // no 99.6 % rung in the fixture: the first named one
    const with996 = [answer.rows[0]!, { ...answer.rows[2]!, label: '99.6 %' }];
    expect(defaultIndex(with996)).toBe(1);
    expect(nearestIndex(answer.rows, -21)).toBe(1);
    expect(nearestIndex(answer.rows, -40)).toBe(3);
  });

  it('says what the mild rung saves against the coldest, and what it risks', () => {
    const s = sentenceFor(answer, 0, 'SI');
    // 4600.00 − 4000.00 = 600; life-cycle 15000.00 − 14400.00 = 600.
    expect(s).toContain('Sizing for −17.0 °C (99 %) instead of −32.0 °C (50-year) installs Furnace 9 kW instead of Furnace 12 kW');
    expect(s).toContain('for $600.00 less to install ($600.00 less over the study period)');
    expect(s).toContain('about 12 hours in an average year and about 40 hours in the worst of the record\'s 4 years');
    expect(s).toContain('cool by up to 1.8 K');
    expect(sentenceFor(answer, 3, 'SI')).toContain('the coldest point of the ladder');
    expect(sentenceFor(answer, 2, 'SI')).toContain('installs the same unit');
  });

  it('interpolates a capacity curve and holds it past its ends', () => {
    const curve = [
      { outdoorC: 10, capacityW: 10000 },
      { outdoorC: -10, capacityW: 6000 },
    ];
    expect(capacityAtC(curve, 0)).toBe(8000);
    expect(capacityAtC(curve, 20)).toBe(10000);
    expect(capacityAtC(curve, -30)).toBe(6000);
  });

  it('lines up the named rungs of compared sweeps, leaving a gap where one lacks a rung', () => {
    const other: SweepAnswer = aSweepAnswer({ rows: answer.rows.filter((r) => r.label !== 'Extreme mean') });
    const rows = comparisonRows([answer, other, null], 'SI');
    expect(rows.map((r) => r.label)).toEqual(['99 %', 'Extreme mean', '50-year']);
    expect(rows[1]?.cells[0]?.unit).toBe('Furnace 12 kW');
    expect(rows[1]?.cells[1]).toBeNull();
    expect(rows[0]?.cells[2]).toBeNull();
  });

  it('marks the chosen design temperature on the chart and puts unmet hours on the second axis', () => {
    const option = tradeoffChart(answer, 2, 'SI', false);
    const series = option.series as { name: string; yAxisIndex: number; markLine?: { data: { xAxis: number; lineStyle: { color: string } }[] } }[];
    expect(series.map((s) => s.name)).toEqual(['Installed price', 'Life-cycle cost', 'Unmet hours per year']);
    expect(series[2]?.yAxisIndex).toBe(1);
    const marks = series[0]?.markLine?.data ?? [];
    expect(marks.filter((m) => m.lineStyle.color === '#C9583A').map((m) => m.xAxis)).toEqual([-24]);
    expect(marks.length).toBe(4); // three named rungs + the chosen point
    const noRecord = tradeoffChart(aSweepAnswer({ hasRecord: false }), 0, 'SI', false);
    expect((noRecord.series as unknown[]).length).toBe(2);
  });

  it('draws the 10–90 % band of the unmet hours and the stated rule’s point, and lists the range, odds and price per row', () => {
    const rows = answer.rows.map((r, i) =>
      i === 0
        ? { ...r, unmetHoursPerYearP10: 6, unmetHoursPerYearP90: 21, annualExceedanceProbability: 0.125, lifetimeExceedanceProbability: 0.93, lifetimeYears: 20 }
        : i === 1
          ? { ...r, unmetHoursPerYearP10: 0, unmetHoursPerYearP90: 2.5, costPerAvoidedUnmetHour: 12.5 }
          : r,
    );
    const banded = aSweepAnswer({ rows, uncertainty: { draws: 300, seed: 1, tolerances: { uaPct: 10, airLeakagePct: 25, pricesPct: 15 } } });
    const option = tradeoffChart(banded, 0, 'SI', false, 3);
    const series = option.series as { name: string; stack?: string; data: [number, number | null][]; markLine?: { data: { xAxis: number; label: { formatter?: string } }[] } }[];
    const band = series.find((x) => x.name === 'Unmet h/yr, 10–90 % range');
    // Stacked on the 10th percentile, the shaded width is P90 − P10: 21 − 6 = 15 and 2.5 − 0 = 2.5.
    expect(band?.stack).toBe('unmet-band');
    expect(band?.data.slice(0, 2)).toEqual([[-17, 15], [-20.5, 2.5]]);
    expect(band?.data[2]).toEqual([-24, null]);
    expect(series[0]?.markLine?.data.some((m) => m.label.formatter === 'Rule' && m.xAxis === -32)).toBeTrue();
    const legend = (option.legend as { data: string[] }).data;
    expect(legend).not.toContain('band-base');
    const text = ladderRows(banded, 'SI');
    expect(text[0]?.unmetRange).toBe('6–21');
    expect(text[0]?.annualOdds).toBe('1-in-8');
    expect(text[0]?.lifetimeOdds).toBe('9-in-10');
    expect(text[1]?.comfortPrice).toBe('$12.50/h');
    expect(text[2]?.unmetRange).toBe('—');
    const compared = comparisonRows([banded], 'SI');
    expect(compared[0]?.cells[0]?.odds).toBe('1-in-8 a year, 9-in-10 over 20 years');
    expect(compared[0]?.cells[0]?.unmetRange).toBe('6–21 unmet h/yr (10–90 %)');
    // Without draws there is no band series.
    expect((tradeoffChart(answer, 0, 'SI', false).series as { name: string }[]).some((x) => x.name.includes('10–90'))).toBeFalse();
  });
});
