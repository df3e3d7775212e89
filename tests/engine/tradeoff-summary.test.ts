/**
 * The plain-words trade-off sentence and the CSV text guard. Money differences are exact decimal
 * arithmetic (decimal.js); the formula guard follows the OWASP "CSV Injection" advice (prefix an
 * apostrophe to cells starting with =, +, −, @, tab or carriage return).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { csvField, csvTextField, unguardCsvText } from '../../shared/csv/csv-field';
import {
  coldestNamedRow,
  homeownerSentence,
  tradeoffSentence,
  type SummaryContext,
} from '../../shared/sweep/tradeoff-summary';

type Row = SummaryContext['rows'][number];
const row = (label: string, designC: number, fields: Partial<Row> = {}): Row => ({
  label,
  designC,
  designLoadW: 9000,
  isGrid: false,
  selectedOptionId: 'b',
  installedPrice: '5180.00',
  lifeCycleCost: '24636.15',
  unmetHoursPerYear: 0,
  unmetHoursWorstYear: 0,
  worstSagC: 0,
  ...fields,
});

const ctx = (rows: Row[], fields: Partial<SummaryContext> = {}): SummaryContext => ({
  rows,
  optionLabel: (id) => ({ a: 'Small furnace', b: 'Large furnace' })[id] ?? id,
  currency: 'USD',
  unitSystem: 'SI',
  hasRecord: true,
  years: 30,
  indoorC: 21,
  ...fields,
});

describe('trade-off sentence (designer)', () => {
  const mild = row('99 %', -17, {
    selectedOptionId: 'a',
    installedPrice: '4290.00',
    lifeCycleCost: '23739.01',
    unmetHoursPerYear: 22.6,
    unmetHoursWorstYear: 110,
    worstSagC: 2.2,
  });
  const grid = row('-20 °C', -20, { isGrid: true, designC: -40 });
  const coldest = row('50-year', -32.5);

  it('names both units, the price differences to whole dollars and the unmet hours', () => {
    const s = tradeoffSentence(mild, ctx([mild, coldest]));
    // 5180.00 − 4290.00 = 890.00; 24636.15 − 23739.01 = 897.14 → $897 (by hand); 21 − 2.2 = 18.8 °C.
    assert.equal(
      s,
      'Sizing for −17.0 °C (99 % design temperature) instead of −32.5 °C (50-year return period) installs Small furnace instead of Large furnace, ' +
        'for $890 less installed ($897 less life-cycle cost over the study period). ' +
        "Unmet hours: 23 hours in an average year and 110 hours in the worst of the record's 30 years; lowest indoor temperature in the worst spell 18.8 °C.",
    );
  });

  it('compares with the coldest named value, not a colder grid step', () => {
    assert.equal(coldestNamedRow([mild, grid, coldest]), coldest);
    assert.match(tradeoffSentence(mild, ctx([mild, grid, coldest])), /instead of −32\.5 °C \(50-year return period\)/);
  });

  it('in °F, and when the same unit covers both', () => {
    const same = row('99 %', -17);
    const cold = row('50-year', -32);
    const s = tradeoffSentence(same, ctx([same, cold], { unitSystem: 'IP' }));
    // −17 °C = 1.4 °F → "1 °F"; −32 °C = −25.6 °F → "−26 °F" (°F = °C × 1.8 + 32).
    assert.match(
      s,
      /^Sizing for 1 °F \(99 % design temperature\) installs the same unit as sizing for −26 °F \(50-year return period\) \(Large furnace\)/,
    );
    assert.match(s, /meets the load in every hour/);
  });

  it('says when no option is large enough, in the reader’s units, and when there is no hourly record', () => {
    const none = row('50-year', -32.5, { selectedOptionId: null, designLoadW: 12300 });
    assert.equal(
      tradeoffSentence(none, ctx([mild, none])),
      'No option on the list delivers the design load of 12.3 kW at −32.5 °C; add a larger unit.',
    );
    // 12 300 W ÷ 0.29307107 W per Btu/h = 41 969 Btu/h → nearest 100: 42,000 Btu/h; −32 °C = −25.6 °F → "−26 °F" (NIST SP 811 factors).
    const noneIp = row('50-year', -32, { selectedOptionId: null, designLoadW: 12300 });
    assert.equal(
      tradeoffSentence(noneIp, ctx([mild, noneIp], { unitSystem: 'IP' })),
      'No option on the list delivers the design load of 42,000 Btu/h at −26 °F; add a larger unit.',
    );
    const s = tradeoffSentence(mild, ctx([mild, coldest], { hasRecord: false }));
    assert.match(s, /need an hourly record/);
    assert.match(
      tradeoffSentence(mild, ctx([mild, none])),
      /no option on the list covers −32\.5 °C \(50-year return period\)/,
    );
  });
});

describe('homeowner sentence', () => {
  it('says in plain words how often and how far the house could cool', () => {
    const r = row('99 %', -17, { unmetHoursPerYear: 3.4, unmetHoursWorstYear: 14, worstSagC: 2.8 });
    // 21 − 2.8 = 18.2 °C, to whole degrees: 18 °C.
    assert.equal(
      homeownerSentence(r, ctx([r])),
      'In a typical winter this unit keeps up except for about 3.4 hours a year on the coldest nights, when the house gets a little cooler than you set it; ' +
        'in the coldest of the last 30 years it would have fallen short for about 14 hours, and at the worst the house would have cooled to about 18 °C.',
    );
  });

  it('says the unit keeps up when it never falls short, and uses no trade term', () => {
    const r = row('50-year', -32.5);
    const s = homeownerSentence(r, ctx([r]));
    assert.match(s, /keeps the house at the temperature you set in every hour of the last 30 years/);
    for (const jargon of [/unmet/i, /design/i, /load/i, /set-point/i, /\bK\b/]) assert.doesNotMatch(s, jargon);
  });

  it('in °F', () => {
    const r = row('99 %', -17, { unmetHoursPerYear: 0.2, unmetHoursWorstYear: 6, worstSagC: 3 });
    // 21 − 3 = 18 °C = 64.4 °F → "64 °F".
    assert.match(
      homeownerSentence(r, ctx([r], { unitSystem: 'IP' })),
      /^On the coldest nights of a typical winter this unit keeps up; in the coldest of the last 30 years it would have fallen short for about 6 hours, and at the worst the house would have cooled to about 64 °F\.$/,
    );
  });
});

describe('CSV text fields', () => {
  it('quotes RFC 4180 specials and guards formula starts but not negative numbers', () => {
    assert.equal(csvField('a,b'), '"a,b"');
    assert.equal(csvField('say "hi"'), '"say ""hi"""');
    assert.equal(csvTextField('=1+1'), "'=1+1");
    assert.equal(csvTextField('+A1'), "'+A1");
    assert.equal(csvTextField('@SUM(A1)'), "'@SUM(A1)");
    assert.equal(csvTextField('-cmd'), "'-cmd");
    assert.equal(csvTextField('-23.5 °C'), '-23.5 °C');
    assert.equal(csvTextField('=HYPERLINK("x")'), '"\'=HYPERLINK(""x"")"');
    assert.equal(csvTextField('Gas bid'), 'Gas bid');
    assert.equal(csvTextField("'=x"), "''=x");
    assert.equal(csvTextField("''x"), "''x");
  });

  it('takes off exactly the apostrophe it added, whatever the text (fast-check)', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom("'", '=', '+', '-', '@', '1', '.', 'a', '\t', ' ') }), (text) => {
        const guarded = csvTextField(text).replace(/^"(.*)"$/s, (_m, inner: string) => inner.replaceAll('""', '"'));
        assert.equal(unguardCsvText(guarded), text);
      }),
      { numRuns: 2000 },
    );
  });
});
