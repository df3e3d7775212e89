/**
 * The plain-words trade-off sentence and the CSV text guard. Money differences are exact decimal
 * arithmetic (decimal.js); the formula guard follows the OWASP "CSV Injection" advice (prefix an
 * apostrophe to cells starting with =, +, −, @, tab or carriage return).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { csvField, csvTextField, unguardCsvText } from '../../shared/csv/csv-field';
import { coldestNamedRow, tradeoffSentence, type SummaryContext } from '../../shared/sweep/tradeoff-summary';

type Row = SummaryContext['rows'][number];
const row = (label: string, designC: number, fields: Partial<Row> = {}): Row => ({
  label,
  designC,
  isGrid: false,
  selectedOptionId: 'b',
  selectionReason: null,
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
  ...fields,
});

describe('trade-off sentence', () => {
  const mild = row('99 %', -17, { selectedOptionId: 'a', installedPrice: '4290.00', lifeCycleCost: '23739.01', unmetHoursPerYear: 22.6, unmetHoursWorstYear: 110, worstSagC: 2.2 });
  const grid = row('-20 °C', -20, { isGrid: true, designC: -40 });
  const coldest = row('50-year', -32.5);

  it('names both units, the exact price differences and the shortfall', () => {
    const s = tradeoffSentence(mild, ctx([mild, coldest]));
    // 5180.00 − 4290.00 = 890.00; 24636.15 − 23739.01 = 897.14 (by hand).
    assert.equal(
      s,
      'Sizing for −17.0 °C (99 %) instead of −32.5 °C (50-year) installs Small furnace instead of Large furnace, for $890.00 less to install ($897.14 less over the study period). ' +
        "It would fall behind the load for about 23 hours in an average year and about 110 hours in the worst of the record's 30 years; in the worst spell the house would cool by up to 2.2 K below the set-point.",
    );
  });

  it('compares with the coldest named rung, not a colder grid step', () => {
    assert.equal(coldestNamedRow([mild, grid, coldest]), coldest);
    assert.match(tradeoffSentence(mild, ctx([mild, grid, coldest])), /instead of −32\.5 °C \(50-year\)/);
  });

  it('in °F, and when the same unit covers both', () => {
    const same = row('99 %', -17);
    const cold = row('50-year', -32);
    const s = tradeoffSentence(same, ctx([same, cold], { unitSystem: 'IP' }));
    // −17 °C = 1.4 °F → "1 °F"; −32 °C = −25.6 °F → "−26 °F" (°F = °C × 1.8 + 32).
    assert.match(s, /^Sizing for 1 °F \(99 %\) installs the same unit as sizing for −26 °F \(50-year\) \(Large furnace\)/);
    assert.match(s, /never fall behind the load/);
  });

  it('says when no option is large enough, and when there is no hourly record', () => {
    const none = row('50-year', -32.5, { selectedOptionId: null, selectionReason: 'No option delivers the design load of 12300 W at -32.5 °C' });
    assert.match(tradeoffSentence(none, ctx([mild, none])), /^No option on the list is large enough for −32\.5 °C \(50-year\): No option delivers/);
    const s = tradeoffSentence(mild, ctx([mild, coldest], { hasRecord: false }));
    assert.match(s, /needs an hourly record/);
    assert.match(tradeoffSentence(mild, ctx([mild, none])), /no option on the list covers −32\.5 °C \(50-year\)/);
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
