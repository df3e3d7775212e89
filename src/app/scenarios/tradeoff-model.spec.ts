import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { aSweepAnswer } from './testing/scenario-fixtures';
import { aScenario } from './testing/scenario-fixtures';
import { comparisonTable, differenceRows } from './compare-rows';
import { loadDurationChart, tradeoffChart } from './tradeoff-charts';
import {
  backupEnergy,
  capacityAtC,
  defaultIndex,
  designRows,
  loadDurationTable,
  nearestIndex,
  pricesText,
  sentenceFor,
} from './tradeoff-text';

describe('trade-off model', () => {
  const answer = aSweepAnswer();

  it('writes the design temperatures in the user’s units, money to whole dollars, "None large enough" without a unit', () => {
    const si = designRows(answer, 'SI');
    expect(si.map((r) => r.temperature)).toEqual(['−17.0 °C', '−20.5 °C', '−24.0 °C', '−32.0 °C']);
    expect(si.map((r) => r.tag)).toEqual(['99 %', '-20.5 °C', 'Annual min.', '50-yr']);
    expect(si[0]?.unit).toBe('Furnace 9 kW');
    expect(si[0]?.installedPrice).toBe('$4,000');
    expect(si[0]?.designLoad).toBe('8.8 kW');
    expect(si[0]?.unmetHours).toBe('12');
    // Lowest indoor temperature: 21 − 1.8 = 19.2 °C; 30 K·h of unmet degree-hours.
    expect(si[0]?.lowestIndoor).toBe('19.2 °C');
    expect(si[0]?.degreeHours).toBe('30 °C·h');
    // −17 °C = 1.4 °F; 19.2 °C = 66.56 °F → "67 °F"; 30 K·h × 1.8 = 54 °F·h; 8800 W ÷ 0.29307107 = 30,027 Btu/h → 30,000.
    const ip = designRows(answer, 'IP');
    expect(ip[0]?.temperature).toBe('1 °F');
    expect(ip[0]?.lowestIndoor).toBe('67 °F');
    expect(ip[0]?.degreeHours).toBe('54 °F·h');
    expect(ip[0]?.designLoad).toBe('30,000 Btu/h');
    // 1.8 K = 3.24 °F shown to 0.1.
    expect(ip[0]?.drop).toBe('3.2 °F');
    const none = designRows(
      aSweepAnswer({ rows: [{ ...answer.rows[0]!, selectedOptionId: null, installedPrice: null }] }),
      'SI',
    );
    expect(none[0]?.unit).toBe('None large enough');
    expect(none[0]?.installedPrice).toBe('—');
  });

  it('writes backup energy like hours: a little is never shown as none, one decimal below 10 kWh', () => {
    expect(backupEnergy(0)).toBe('0 kWh');
    expect(backupEnergy(0.02)).toBe('< 0.1 kWh');
    expect(backupEnergy(0.4)).toBe('0.4 kWh');
    expect(backupEnergy(9.94)).toBe('9.9 kWh');
    expect(backupEnergy(1234.4)).toBe('1,234 kWh');
  });

  it('reads the load-duration chart out as a table: load at 1, 10, 50 … hours a year against the chosen unit', () => {
    // Fixture points (hours a year at or above, load, outdoor): 1 h 11.5 kW −30 °C; 20 h 9.2 kW −19 °C;
    // 2,000 h 4.0 kW 0 °C; 5,000 h 500 W 15 °C. The 99 % design temperature installs the flat 9 kW furnace.
    const mild = loadDurationTable(answer, 0, 'SI');
    expect(mild.map((r) => r.hours)).toEqual(['1.0', '20', '2,000', '5,000']);
    expect(mild.map((r) => r.load)).toEqual(['11.5 kW', '9.2 kW', '4.0 kW', '500 W']);
    expect(mild.map((r) => r.outdoor)).toEqual(['−30.0 °C', '−19.0 °C', '0.0 °C', '15.0 °C']);
    expect(mild.map((r) => r.capacity)).toEqual(['9.0 kW', '9.0 kW', '9.0 kW', '9.0 kW']);
    expect(mild.map((r) => r.keepsUp)).toEqual(['No', 'No', 'Yes', 'Yes']);
    // The 50-year design temperature installs the 12 kW furnace, which meets every hour.
    expect(loadDurationTable(answer, 3, 'SI').map((r) => r.keepsUp)).toEqual(['Yes', 'Yes', 'Yes', 'Yes']);
    // 11,500 W × 3.41214 = 39,240 Btu/h, shown to the 100.
    expect(loadDurationTable(answer, 0, 'IP')[0]?.load).toBe('39,200 Btu/h');
    expect(loadDurationTable(aSweepAnswer({ loadDuration: null }), 0, 'SI')).toEqual([]);
  });

  it('opens on the 99.6 % value when there is one, else on the first named one; finds the nearest row to a temperature', () => {
    expect(defaultIndex(answer.rows)).toBe(0); // no 99.6 % row in the fixture: the first named one
    const with996 = [answer.rows[0]!, { ...answer.rows[2]!, kind: 'p996' as const, label: '99.6 %' }];
    expect(defaultIndex(with996)).toBe(1);
    expect(nearestIndex(answer.rows, -21)).toBe(1);
    expect(nearestIndex(answer.rows, -40)).toBe(3);
  });

  it('says what the mild point saves against the coldest, and what it risks, in the trade’s terms', () => {
    const s = sentenceFor(answer, 0, 'SI');
    // 4600.00 − 4000.00 = 600; life-cycle 15000.00 − 14400.00 = 600; lowest indoor 21 − 1.8 = 19.2 °C.
    expect(s).toContain(
      'Sizing for −17.0 °C (99 % design temperature) instead of −32.0 °C (50-year return period) installs Furnace 9 kW instead of Furnace 12 kW',
    );
    expect(s).toContain('for $600 less installed ($600 less life-cycle cost over the study period)');
    expect(s).toContain("Unmet hours: 12 hours in an average year and 40 hours in the worst of the record's 4 years");
    expect(s).toContain('lowest indoor temperature in the worst spell 19.2 °C');
    expect(sentenceFor(answer, 3, 'SI')).toContain('the coldest of the design temperatures');
    expect(sentenceFor(answer, 2, 'SI')).toContain('installs the same unit');
  });

  it('draws the load-duration chart in kW or kBtu/h, like the headline figures', () => {
    const si = loadDurationChart(answer, 0, 'SI', false)!;
    expect((si.yAxis as { name: string }).name).toBe('Load (kW)');
    const first = (si.series as { data: number[][] }[])[0]!.data[0]!;
    expect(first).toEqual([1, 11.5]);
    const ip = loadDurationChart(answer, 0, 'IP', false)!;
    expect((ip.yAxis as { name: string }).name).toBe('Load (kBtu/h)');
    // 11 500 W ÷ 0.29307107 W per Btu/h = 39 239 Btu/h = 39.24 kBtu/h.
    expect((ip.series as { data: number[][] }[])[0]!.data[0]![1]).toBeCloseTo(39.24, 2);
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

  it('compares each scenario at its chosen point, with a difference row against the baseline', () => {
    const other: SweepAnswer = aSweepAnswer({
      currency: 'USD',
      rows: answer.rows.map((r) =>
        r.label === '99 %' ? { ...r, installedPrice: '4500.00', annualCost: '900.00', unmetHoursPerYear: 3.5 } : r,
      ),
    });
    const prices = {
      currency: 'USD',
      electricityPerKwh: '0.1523',
      gas: { unit: 'therm' as const, price: '1.2' },
      propanePerLitre: '0.8',
    };
    const entries = [
      {
        scenario: aScenario({ id: 'a', name: 'Gas line', chosenDesignC: null }),
        sweep: { ...answer, rows: answer.rows.map((r) => ({ ...r, annualCost: '1000.00' })) },
        prices,
      },
      { scenario: aScenario({ id: 'b', name: 'Other line', chosenDesignC: -17 }), sweep: other, prices: null },
    ];
    const table = comparisonTable(entries, 'chosen', 'SI');
    const row = (key: string) => table.rows.find((r) => r.key === key)!.cells;
    expect(row('designTemperature')).toEqual(['−17.0 °C (99 %)', '−17.0 °C (99 %)']);
    expect(row('installedPrice')).toEqual(['$4,000', '$4,500']);
    expect(row('lifeCycleCost')).toEqual(['$14,400 over 20 years', '$14,400 over 20 years']);
    expect(row('unmetHours')).toEqual(['12', '3.5']);
    expect(row('equipmentLife')).toEqual(['20 years', '20 years']);
    expect(row('discountRate')).toEqual(['3 %', '3 %']);
    expect(row('prices')[0]).toBe('electricity $0.1523/kWh · gas $1.20/therm · propane $0.80/L');
    // 0.80 per litre × 3.785411784 L per US gallon = 3.0283 per gallon.
    expect(pricesText(prices, 'IP')).toContain('propane $3.0283/gal');
    const diff = differenceRows(table, 0);
    expect(diff.map((d) => d.cells)).toEqual([
      ['baseline', '+$500'],
      ['baseline', '−$100'],
      ['baseline', 'same'],
      ['baseline', '−8.5 h'],
    ]);
    // At a named value instead: the 50-year one.
    expect(comparisonTable(entries, '50-year', 'SI').rows.find((r) => r.key === 'designTemperature')!.cells).toEqual([
      '−32.0 °C (50-yr)',
      '−32.0 °C (50-yr)',
    ]);
  });

  it('marks the chosen design temperature on the chart and puts unmet hours on the second axis', () => {
    const option = tradeoffChart(answer, 2, 'SI', false);
    const series = option.series as {
      name: string;
      yAxisIndex: number;
      markLine?: { data: { xAxis: number; lineStyle: { color: string } }[] };
    }[];
    expect(series.map((s) => s.name)).toEqual(['Installed price', 'Life-cycle cost', 'Unmet hours per year']);
    expect(series[2]?.yAxisIndex).toBe(1);
    const marks = series[0]?.markLine?.data ?? [];
    expect(marks.filter((m) => m.lineStyle.color === '#C9583A').map((m) => m.xAxis)).toEqual([-24]);
    expect(marks.length).toBe(4); // three named values + the chosen point
    const noRecord = tradeoffChart(aSweepAnswer({ hasRecord: false }), 0, 'SI', false);
    expect((noRecord.series as unknown[]).length).toBe(2);
  });

  it('draws the 10–90 % band of the unmet hours and the stated rule’s point, and lists the range, odds and price per row', () => {
    const rows = answer.rows.map((r, i) =>
      i === 0
        ? {
            ...r,
            unmetHoursPerYearP10: 6,
            unmetHoursPerYearP90: 21,
            annualExceedanceProbability: 0.125,
            lifetimeExceedanceProbability: 0.93,
            lifetimeYears: 20,
          }
        : i === 1
          ? { ...r, unmetHoursPerYearP10: 0, unmetHoursPerYearP90: 2.5, costPerAvoidedUnmetHour: 12.5 }
          : r,
    );
    const banded = aSweepAnswer({
      rows,
      uncertainty: { draws: 300, seed: 1, tolerances: { uaPct: 10, airLeakagePct: 25, pricesPct: 15 } },
    });
    const option = tradeoffChart(banded, 0, 'SI', false, 3);
    const series = option.series as {
      name: string;
      stack?: string;
      data: [number, number | null][];
      markLine?: { data: { xAxis: number; label: { formatter?: string } }[] };
    }[];
    const band = series.find((x) => x.name === 'Unmet h/yr, 10–90 % range');
    // Stacked on the 10th percentile, the shaded width is P90 − P10: 21 − 6 = 15 and 2.5 − 0 = 2.5.
    expect(band?.stack).toBe('unmet-band');
    expect(band?.data.slice(0, 2)).toEqual([
      [-17, 15],
      [-20.5, 2.5],
    ]);
    expect(band?.data[2]).toEqual([-24, null]);
    expect(series[0]?.markLine?.data.some((m) => m.label.formatter === 'Rule' && m.xAxis === -32)).toBeTrue();
    const legend = (option.legend as { data: string[] }).data;
    expect(legend).not.toContain('band-base');
    const text = designRows(banded, 'SI');
    expect(text[0]?.unmetRange).toBe('6–21');
    expect(text[0]?.annualOdds).toBe('1-in-8');
    expect(text[0]?.lifetimeOdds).toBe('9-in-10');
    expect(text[1]?.comfortPrice).toBe('$12.50/h');
    expect(text[2]?.unmetRange).toBe('—');
    const compared = comparisonTable(
      [{ scenario: { id: 's1', name: 'Banded', frozenAt: null, chosenDesignC: null }, sweep: banded, prices: null }],
      banded.rows[0]?.label ?? '',
      'SI',
    );
    expect(compared.rows.find((r) => r.key === 'odds')?.cells[0]).toBe('1-in-8 a year, 9-in-10 over 20 years');
    expect(compared.rows.find((r) => r.key === 'unmetRange')?.cells[0]).toBe('6–21 h/yr');
    // Without draws there is no band series.
    expect(
      (tradeoffChart(answer, 0, 'SI', false).series as { name: string }[]).some((x) => x.name.includes('10–90')),
    ).toBeFalse();
  });
});
