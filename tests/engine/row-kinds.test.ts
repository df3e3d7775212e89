/**
 * Row kinds: every ladder row says what it stands for, so that code finds rows by kind and the label
 * stays display text. Rows kept from before the kind was carried (stored reports, cached results)
 * get it from their label when parsed. The design values are invented round numbers.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { sweepRowSchema } from '../../shared/scenarios/scenario-schemas';
import { designLadder } from '../../shared/sweep/sweep';

describe('row kinds', () => {
  const ladder = designLadder(
    {
      heating: { db99: -10, db99_6: -12 },
      extremeMin: { mean: -15, returnPeriod: { '5': -16, '10': -17, '20': -18, '50': -19.2 } },
    },
    [-13.2],
  );

  it('names each design value by its kind, extras as extra and the 0.5 °C grid as grid', () => {
    const named = ladder.filter((r) => r.kind !== 'grid').map((r) => [r.kind, r.designC]);
    assert.deepEqual(named, [
      ['p99', -10],
      ['p996', -12],
      ['extra', -13.2],
      ['annualMin', -15],
      ['rp5', -16],
      ['rp10', -17],
      ['rp20', -18],
      ['rp50', -19.2],
    ]);
    const grid = ladder.filter((r) => r.kind === 'grid');
    assert.ok(grid.length > 0);
    assert.ok(grid.every((r) => r.isGrid && Number.isInteger(r.designC * 2)));
  });

  /** A row as stored before rows carried their kind. */
  const stored = (label: string, isGrid: boolean): Record<string, unknown> => ({
    label,
    designC: -12,
    isGrid,
    designLoadW: 9000,
    selectedOptionId: null,
    selectionReason: null,
    capacityAtDesignW: null,
    installedPrice: null,
    annualEnergyKWh: null,
    annualCost: null,
    runHoursPerYear: null,
    unmetHoursPerYear: null,
    unmetHoursWorstYear: null,
    unmetEnergyKWhPerYear: null,
    unmetDegreeHoursPerYear: null,
    worstSagC: null,
    lifeCycleCost: null,
    unavailableReason: null,
    costUnavailableReason: null,
  });

  it('gives a stored row without a kind the kind of its label', () => {
    const kindOf = (label: string, isGrid: boolean) => sweepRowSchema.parse(stored(label, isGrid)).kind;
    assert.equal(kindOf('99 %', false), 'p99');
    assert.equal(kindOf('99.6 %', false), 'p996');
    assert.equal(kindOf('Extreme mean', false), 'annualMin');
    assert.equal(kindOf('50-year', false), 'rp50');
    assert.equal(kindOf('-13.2 °C', false), 'extra');
    assert.equal(kindOf('-20.5 °C', true), 'grid');
  });

  it('keeps a kind the row carries and refuses an unknown one', () => {
    assert.equal(sweepRowSchema.parse({ ...stored('99 %', false), kind: 'rp20' }).kind, 'rp20');
    assert.throws(() => sweepRowSchema.parse({ ...stored('99 %', false), kind: 'median' }));
  });
});
