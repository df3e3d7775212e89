/**
 * The odds, the price of comfort and the uncertainty band through the API (docs/methods.md#odds-of-a-colder-night,
 * #uncertainty-band): the band comes with the sweep from the worker pool, changes with the seed and
 * tolerances, equals the nominal figures with zero tolerances; bad tolerances and rules answer 400
 * with field paths; a published-values site gets odds from its typed-in mean and SD.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { returnPeriodMinimum } from '../../shared/climate/extremes';
import { type Scenario, scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { parseError } from '../support/parse-body';
import { fixture, type Fixture } from '../support/scenario-fixture';
import { useTestApp } from '../support/test-app';

const t = useTestApp();
const base = (f: Fixture) => `/api/v1/projects/${f.projectId}/scenarios`;
const sweepOf = async (f: Fixture, id: string) =>
  sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${id}/sweep`).expect(200)).body);

describe('odds and uncertainty through the API', () => {
  it('sweeps with the odds and the band, reproducibly, and with zero tolerances the band is the nominal sweep', async () => {
    const f = await fixture(t);
    const s = scenarioSchema.parse(
      (
        await f.agent
          .post(base(f))
          .send({ name: 'Odds', settings: { uncertainty: { draws: 40, seed: 5 } } })
          .expect(201)
      ).body,
    );
    assert.deepEqual(s.settings.tolerances, { uaPct: 10, airLeakagePct: 25, pricesPct: 15 });
    const a = await sweepOf(f, s.id);
    assert.deepEqual(a.uncertainty, {
      draws: 40,
      seed: 5,
      tolerances: { uaPct: 10, airLeakagePct: 25, pricesPct: 15 },
    });
    assert.equal(a.odds?.source, 'record');
    assert.equal(a.odds.years, a.years.length);
    assert.equal(a.odds.shortRecord, true, 'a 4-year record is short');
    const fifty = a.rows.find((r) => r.label === '50-year');
    assert.ok(fifty);
    // The record's own fit: p = 1/50 at its 50-year value (method of moments, ASHRAE Fundamentals Ch. 14).
    assert.ok(Math.abs((fifty.annualExceedanceProbability ?? NaN) - 0.02) < 1e-9);
    assert.ok(a.rows.some((r) => r.unmetHoursPerYearP10 !== null && r.lifeCycleCostP10 !== null));

    const patch = (settings: Scenario['settings'], version: number) =>
      f.agent
        .patch(`${base(f)}/${s.id}`)
        .send({ version, settings })
        .expect(200);
    const zero = scenarioSchema.parse(
      (await patch({ ...s.settings, tolerances: { uaPct: 0, airLeakagePct: 0, pricesPct: 0 } }, s.version)).body,
    );
    const z = await sweepOf(f, s.id);
    assert.equal(z.cached, false);
    for (const r of z.rows) {
      assert.equal(r.unmetHoursPerYearP10, r.unmetHoursPerYear);
      assert.equal(r.unmetHoursPerYearP90, r.unmetHoursPerYear);
      assert.equal(r.lifeCycleCostP90, r.lifeCycleCost);
      if (r.selectionChangeShare !== null) assert.equal(r.selectionChangeShare, 0);
    }
    // Back to the first settings: the same seed gives the same band (answered from the cache or not).
    await patch(s.settings, zero.version);
    const again = await sweepOf(f, s.id);
    assert.deepEqual(
      again.rows.map((r) => [r.unmetHoursPerYearP10, r.unmetHoursPerYearP90, r.lifeCycleCostP10, r.lifeCycleCostP90]),
      a.rows.map((r) => [r.unmetHoursPerYearP10, r.unmetHoursPerYearP90, r.lifeCycleCostP10, r.lifeCycleCostP90]),
    );
  });

  it('refuses bad tolerances, draws and rules with field paths, and keeps the stored settings', async () => {
    const f = await fixture(t);
    const s = scenarioSchema.parse((await f.agent.post(base(f)).send({ name: 'Odds' }).expect(201)).body);
    const res = await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({
        version: s.version,
        settings: {
          tolerances: { uaPct: -5, airLeakagePct: 'lots', pricesPct: 200 },
          uncertainty: { draws: 1.5, seed: -1 },
          rule: { maxUnmetHoursWorstYear: -1, maxLifetimeOddsPct: 150 },
        },
      })
      .expect(400);
    const paths = (parseError(res).details ?? []).map((d) => d.path).sort();
    assert.deepEqual(paths, [
      'settings.rule.maxLifetimeOddsPct',
      'settings.rule.maxUnmetHoursWorstYear',
      'settings.tolerances.airLeakagePct',
      'settings.tolerances.pricesPct',
      'settings.tolerances.uaPct',
      'settings.uncertainty.draws',
      'settings.uncertainty.seed',
    ]);
    const stored = scenarioSchema.parse((await f.agent.get(`${base(f)}/${s.id}`).expect(200)).body);
    assert.deepEqual(stored.settings, s.settings);
    assert.equal(stored.version, s.version);
  });

  it('gives a published-values site its odds from the typed-in mean and SD, without a band', async () => {
    const f = await fixture(t);
    await t
      .db('climate_sites')
      .where({ id: f.publishedSiteId })
      .update({
        published_values: JSON.stringify({
          source: 'Invented',
          heating: { db99_6: -18, db99: -15 },
          extremeMin: { mean: -22, sd: 3, returnPeriod: { '50': returnPeriodMinimum(-22, 3, 50) } },
        }),
      });
    const s = scenarioSchema.parse(
      (await f.agent.post(base(f)).send({ name: 'Published', climateSiteId: f.publishedSiteId }).expect(201)).body,
    );
    const a = await sweepOf(f, s.id);
    assert.deepEqual(a.odds, { meanC: -22, sdK: 3, source: 'published', years: null, shortRecord: false });
    assert.equal(a.uncertainty, null);
    const fifty = a.rows.find((r) => r.label === '50-year');
    assert.ok(Math.abs((fifty?.annualExceedanceProbability ?? NaN) - 0.02) < 1e-9);
    for (const r of a.rows) assert.equal(r.unmetHoursPerYearP10, null);
  });
});
