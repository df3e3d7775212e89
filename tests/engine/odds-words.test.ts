/**
 * The odds, the price of comfort and the band in sentences (docs/methods.md#odds-of-a-colder-night,
 * #price-of-comfort, #uncertainty-band), on hand-made rows: the figures in the sentences are the rows'.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import {
  bandSentence,
  comfortSentence,
  hoursRange,
  oddsBasisSentence,
  oddsSentence,
  oneIn,
  plainBandSentence,
  plainComfortSentence,
  plainLifetimeSentence,
  type OddsContext,
  type OddsRow,
} from '../../shared/sweep/odds-words';

const row = (fields: Partial<OddsRow> & Pick<OddsRow, 'designC' | 'selectedOptionId'>): OddsRow => ({
  label: `${fields.designC} °C`,
  isGrid: false,
  annualExceedanceProbability: null,
  recordExceedanceShare: null,
  lifetimeExceedanceProbability: null,
  lifetimeYears: null,
  costPerAvoidedUnmetHour: null,
  costPerAvoidedWorstYearHour: null,
  unmetHoursPerYear: null,
  unmetHoursPerYearP10: null,
  unmetHoursPerYearP90: null,
  unmetHoursWorstYearP10: null,
  unmetHoursWorstYearP90: null,
  lifeCycleCostP10: null,
  lifeCycleCostP90: null,
  selectionChangeShare: null,
  ...fields,
});

const rows: OddsRow[] = [
  row({
    designC: -15,
    selectedOptionId: 'a',
    annualExceedanceProbability: 0.8,
    recordExceedanceShare: 0.8,
    lifetimeExceedanceProbability: 1,
    lifetimeYears: 20,
  }),
  row({
    designC: -20,
    selectedOptionId: 'b',
    annualExceedanceProbability: 0.125,
    recordExceedanceShare: 0.1,
    lifetimeExceedanceProbability: 0.93,
    lifetimeYears: 20,
    costPerAvoidedUnmetHour: 2.4,
    costPerAvoidedWorstYearHour: 0.6,
    unmetHoursPerYearP10: 5,
    unmetHoursPerYearP90: 30,
    unmetHoursWorstYearP10: 20,
    unmetHoursWorstYearP90: 90,
    lifeCycleCostP10: '10100.40',
    lifeCycleCostP90: '12299.60',
    selectionChangeShare: 0.12,
  }),
  row({
    designC: -22,
    selectedOptionId: 'b',
    annualExceedanceProbability: 0.05,
    lifetimeExceedanceProbability: 0.25,
    lifetimeYears: 20,
  }),
  row({ designC: -26, selectedOptionId: 'c', costPerAvoidedUnmetHour: 41, lifetimeYears: 20 }),
];
const ctx: OddsContext = {
  rows,
  currency: 'USD',
  unitSystem: 'SI',
  odds: { meanC: -17, sdK: 3, source: 'record', years: 30, shortRecord: false },
  uncertainty: { draws: 300, tolerances: { uaPct: 10, airLeakagePct: 25, pricesPct: 15 } },
};

describe('odds in words', () => {
  it('says the annual, record and lifetime odds of the chosen point', () => {
    assert.equal(
      oddsSentence(1, ctx),
      'A night colder than −20.0 °C: about a 1-in-8 chance in any one winter (3 of the 30 winters on record had one), and about a 9-in-10 chance over the 20-year study period.',
    );
    assert.equal(
      plainLifetimeSentence(rows[2]!, 'IP'),
      'There is about a 1-in-4 chance of at least one night colder than −8 °F in the next 20 years, the period over which the costs are compared.',
    );
    // The homeowner reads whole degrees, as everywhere else in the report (−22.4 °C → −22 °C).
    assert.equal(
      plainLifetimeSentence({ ...rows[2]!, designC: -22.4 }, 'SI'),
      'There is about a 1-in-4 chance of at least one night colder than −22 °C in the next 20 years, the period over which the costs are compared.',
    );
    assert.match(
      oddsBasisSentence({ ...ctx.odds!, years: 6, shortRecord: true }) ?? '',
      /fewer than 10 years on record these odds mean little/,
    );
    assert.match(
      oddsBasisSentence({ meanC: -20, sdK: 3, source: 'published', years: null, shortRecord: false }) ?? '',
      /published mean and standard deviation/,
    );
  });

  it('prices the step into the chosen unit and the step to the next larger one', () => {
    // Row −22 °C has unit b, which came in at −20 °C (2.40 per hour); c comes in at −26 °C (41.00 per hour).
    assert.equal(
      comfortSentence(2, ctx),
      'Going up to this unit at −20.0 °C costs about $2.40 for each cold hour it avoids in an average year over 20 years ($0.60 if every year were like the worst on record). ' +
        'The next larger unit, from −26.0 °C, costs about $41.00 for each cold hour it avoids in an average year over 20 years.',
    );
    assert.equal(
      plainComfortSentence(2, ctx),
      'Compared with the next smaller unit, each hour of cold it avoids costs about $2.40 over 20 years.',
    );
    assert.equal(comfortSentence(0, { ...ctx, rows: [rows[0]!] }), '');
  });

  it('gives the band in the trade’s terms and in plain words, naming the larger tolerance first', () => {
    assert.equal(
      bandSentence(1, ctx),
      'Over 300 draws with UA ±10 %, air leakage ±25 % and prices ±15 %, the unmet hours per average year range from 5 to 30 (10th to 90th percentile), ' +
        'in the worst year from 20 to 90; the life-cycle cost from $10,100 to $12,300. A different unit would be selected in 12 % of the draws.',
    );
    assert.equal(
      plainBandSentence(rows[1]!, ctx),
      'How often it falls behind: between about 5 and about 30 hours a year, depending on how leaky the house turns out to be and how well it is insulated.',
    );
    assert.equal(plainBandSentence(rows[0]!, ctx), null);
    assert.equal(bandSentence(0, ctx), '');
  });

  it('fits the table cells', () => {
    assert.equal(oneIn(0.125), '1-in-8');
    assert.equal(oneIn(0.7), '7-in-10');
    assert.equal(oneIn(0.001), '< 1-in-100');
    assert.equal(oneIn(null), '—');
    assert.equal(hoursRange(5, 30), '5–30');
    assert.equal(hoursRange(2.345, 2.345), '2.3');
    assert.equal(hoursRange(null, 3), '—');
  });
});
