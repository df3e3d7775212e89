/**
 * Scenarios and sweeps through the API: CRUD, incomplete inputs (422 with fields), the sweep run in
 * the worker pool and its cache, freezing, comparison and CSV, roles and other organisations.
 * The sweep answer is checked against the engine's naive reference run in the test over the same
 * stored record (docs/methods.md#hourly, #life-cycle-cost).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { resolveDesignWind } from '../../shared/building/heat-loss';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { equipmentOptionSchema } from '../../shared/equipment/equipment-schemas';
import {
  type Scenario,
  type SweepAnswer,
  comparisonSchema,
  scenarioListSchema,
  scenarioSchema,
  sweepAnswerSchema,
} from '../../shared/scenarios/scenario-schemas';
import { sweepNaive, type SweepOption } from '../../shared/sweep/sweep';
import { loadRecord } from '../../server/modules/climate/climate-repo';
import { parseBody, parseError } from '../support/parse-body';
import { BUILDING, OPTIONS, PRICES, fixture, type Fixture } from '../support/scenario-fixture';
import { inviteMember, signUp, useTestApp } from '../support/test-app';

const t = useTestApp();

const base = (f: Fixture) => `/api/v1/projects/${f.projectId}/scenarios`;

async function createScenario(f: Fixture, body: Record<string, unknown> = {}): Promise<Scenario> {
  const res = await f.agent
    .post(base(f))
    .send({ name: 'Base bid', ...body })
    .expect(201);
  return scenarioSchema.parse(res.body);
}

describe('scenarios API', () => {
  it('creates a scenario with the project’s site and list, lists, renames with a version, duplicates and deletes', async () => {
    const f = await fixture(t);
    const s = await createScenario(f);
    assert.equal(s.climateSiteId, f.siteId);
    assert.equal(s.equipmentListId, f.listId);
    assert.equal(s.settings.discountRatePct, 3);
    assert.equal(s.settings.optionLabels, null);
    assert.equal(s.frozenAt, null);
    const renamed = await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, name: 'Renamed' })
      .expect(200);
    assert.equal(scenarioSchema.parse(renamed.body).name, 'Renamed');
    const stale = await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, name: 'Again' })
      .expect(409);
    assert.equal(parseError(stale).code, 'stale_update');
    const copy = await f.agent
      .post(`${base(f)}/${s.id}/duplicate`)
      .send({})
      .expect(201);
    assert.equal(scenarioSchema.parse(copy.body).name, 'Renamed (copy)');
    const list = await f.agent.get(base(f)).expect(200);
    assert.deepEqual(
      scenarioListSchema.parse(list.body).map((x) => x.name),
      ['Renamed', 'Renamed (copy)'],
    );
    await f.agent.delete(`${base(f)}/${s.id}`).expect(204);
    await f.agent.delete(`${base(f)}/${s.id}`).expect(404);
  });

  it('refuses bad settings with field details and stores nothing', async () => {
    const f = await fixture(t);
    const res = await f.agent
      .post(base(f))
      .send({ name: ' ', settings: { discountRatePct: -1, extraDesignC: [-90], optionLabels: [] } })
      .expect(400);
    const paths = (parseError(res).details ?? []).map((d) => d.path).sort();
    assert.deepEqual(paths, ['name', 'settings.discountRatePct', 'settings.extraDesignC.0', 'settings.optionLabels']);
    assert.equal(parseBody(scenarioListSchema, await f.agent.get(base(f)).expect(200)).length, 0);
  });

  it('answers 422 with what is missing when a scenario cannot be swept', async () => {
    const f = await fixture(t, false);
    const s = await createScenario(f, { equipmentListId: null });
    const res = await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(422);
    const error = parseError(res);
    assert.equal(error.code, 'scenario_incomplete');
    assert.deepEqual((error.details ?? []).map((d) => d.path).sort(), ['building', 'equipmentListId']);
  });

  it('sweeps in the worker pool, agrees with the naive reference over the stored record, and caches by input', async () => {
    const f = await fixture(t);
    const s = await createScenario(f, { settings: { extraDesignC: [-12.3], discountRatePct: 4 } });
    await f.agent.get(`${base(f)}/${s.id}/sweep`).expect(404);
    const first = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.equal(first.cached, false);
    assert.equal(first.hasRecord, true);
    assert.equal(first.years.length, 4);
    assert.ok(first.rows.some((r) => r.label === '-12.3 °C' && !r.isGrid));
    assert.ok(first.loadDuration && first.loadDuration.points.length > 10);

    // Independent run: the engine's naive path over the record read back from the database.
    const series = await loadRecord(t.db, f.siteId);
    const dc = computeDesignConditions(series, {});
    assert.ok(dc.ok);
    const options: SweepOption[] = OPTIONS.map((o, i) => ({ ...equipmentOptionSchema.parse(o), id: String(i + 1) }));
    const naive = sweepNaive({
      building: BUILDING,
      options,
      prices: { currency: 'USD', electricityPerKwh: '0.1600', gas: { unit: 'kWh', price: '0.0450' } },
      economics: { discountRatePct: 4 },
      designConditions: dc.conditions,
      designWindMs: resolveDesignWind(BUILDING.designWind, dc.conditions.wind).windMs,
      record: { series, qualifyingYears: dc.conditions.period.qualifyingYears },
      extraDesignC: [-12.3],
    });
    assert.deepEqual(first.years, dc.conditions.period.qualifyingYears);
    assert.equal(first.rows.length, naive.rows.length);
    for (const [i, row] of first.rows.entries()) {
      const ref = naive.rows[i];
      assert.ok(ref);
      assert.equal(row.label, ref.label);
      assert.equal(row.selectedOptionId, ref.selectedOptionId, row.label);
      assert.equal(row.installedPrice, ref.installedPrice);
      for (const k of [
        'designLoadW',
        'annualEnergyKWh',
        'runHoursPerYear',
        'unmetHoursPerYear',
        'unmetDegreeHoursPerYear',
        'worstSagC',
      ] as const) {
        const a = row[k];
        const b = ref[k];
        assert.ok(
          a === b || (a !== null && b !== null && Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b))),
          `${row.label} ${k}: ${a} vs ${b}`,
        );
      }
      if (row.lifeCycleCost !== null && ref.lifeCycleCost !== null) {
        assert.ok(Math.abs(Number(row.lifeCycleCost) - Number(ref.lifeCycleCost)) <= 0.011, `${row.label} LCC`);
      }
    }

    const second = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.equal(second.cached, true);
    assert.equal(second.inputHash, first.inputHash);
    const read = sweepAnswerSchema.parse((await f.agent.get(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.deepEqual(read.rows, first.rows);

    // Another input, another hash.
    await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, settings: { ...s.settings, discountRatePct: 7 } })
      .expect(200);
    await f.agent.get(`${base(f)}/${s.id}/sweep`).expect(404);
    const third = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.notEqual(third.inputHash, first.inputHash);

    // A change to the project's building, the list or the prices gives another sweep too.
    await f.agent
      .put(`/api/v1/projects/${f.projectId}/building`)
      .send({ version: 2, building: { ...BUILDING, conduction: { mode: 'ua', uaWPerK: 200 } } })
      .expect(200);
    const fourth = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.notEqual(fourth.inputHash, third.inputHash);
    assert.ok((fourth.rows[0]?.designLoadW ?? 0) > (third.rows[0]?.designLoadW ?? 0));
    await f.agent
      .put('/api/v1/energy-prices')
      .send({ version: 1, prices: { ...PRICES, electricityPerKwh: '0.2000' } })
      .expect(200);
    const fifth = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.notEqual(fifth.inputHash, fourth.inputHash);
  });

  it('sends a cached sweep with an entity tag (304 to a GET that has it), and a renamed site or list gives a new answer', async () => {
    const f = await fixture(t);
    const s = await createScenario(f);
    const url = `${base(f)}/${s.id}/sweep`;
    const first = await f.agent.post(url).expect(200);
    assert.equal(sweepAnswerSchema.parse(first.body).cached, false);
    const cached = await f.agent.get(url).expect(200);
    const etag = cached.headers['etag'];
    assert.ok(typeof etag === 'string' && etag.length > 10, 'an entity tag');
    assert.equal(sweepAnswerSchema.parse(cached.body).cached, true);
    const again = await f.agent.post(url).expect(200);
    assert.equal(again.headers['etag'], etag, 'the same answer has the same tag');
    assert.deepEqual(again.body, cached.body);
    await f.agent.get(url).set('If-None-Match', etag).expect(304);

    // The names in the answer follow renames, though the figures (and the input hash) do not change.
    await f.agent
      .patch(`/api/v1/climate-sites/${f.siteId}`)
      .send({ name: 'Renamed hourly site (invented)' })
      .expect(200);
    const renamedSite = await f.agent.get(url).set('If-None-Match', etag).expect(200);
    assert.equal(sweepAnswerSchema.parse(renamedSite.body).climateSiteName, 'Renamed hourly site (invented)');
    assert.equal(sweepAnswerSchema.parse(renamedSite.body).inputHash, sweepAnswerSchema.parse(cached.body).inputHash);
    assert.notEqual(renamedSite.headers['etag'], etag);
    await f.agent.patch(`/api/v1/equipment-lists/${f.listId}`).send({ version: 2, name: 'Renamed list' }).expect(200);
    const renamedList = await f.agent.post(url).expect(200);
    assert.equal(sweepAnswerSchema.parse(renamedList.body).equipmentListName, 'Renamed list');
    assert.notEqual(renamedList.headers['etag'], renamedSite.headers['etag']);
  });

  it('a subset of the list, and a typed-in site gives capacity and price with the hour-based figures marked unavailable', async () => {
    const f = await fixture(t);
    const s = await createScenario(f, {
      climateSiteId: f.publishedSiteId,
      settings: { optionLabels: ['F 9 kW', 'F 14 kW', 'Gone'] },
    });
    const a = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.equal(a.hasRecord, false);
    assert.equal(a.loadDuration, null);
    assert.deepEqual(
      a.options.map((o) => o.label),
      ['F 9 kW', 'F 14 kW'],
    );
    assert.ok(a.notes.some((n) => n.includes('Gone')));
    const named = a.rows.filter((r) => !r.isGrid).map((r) => r.label);
    assert.deepEqual(named, ['99 %', '99.6 %', 'Extreme mean', '50-year']);
    for (const r of a.rows) {
      assert.equal(r.unmetHoursPerYear, null);
      if (r.selectedOptionId) assert.match(r.unavailableReason ?? '', /hourly record/);
    }
  });

  it('freezes an immutable dated copy: its inputs cannot change, its result stays when the list changes', async () => {
    const f = await fixture(t);
    const s = await createScenario(f);
    const frozen = scenarioSchema.parse(
      (
        await f.agent
          .post(`${base(f)}/${s.id}/freeze`)
          .send({})
          .expect(201)
      ).body,
    );
    assert.ok(frozen.frozenAt);
    assert.equal(frozen.frozenFromId, s.id);
    assert.match(frozen.name, /^Base bid · bid \d{4}-\d{2}-\d{2}$/);
    assert.deepEqual(frozen.settings.prices, PRICES);
    const before = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${frozen.id}/sweep`).expect(200)).body);
    assert.equal(before.frozen, true);

    const refused = await f.agent
      .patch(`${base(f)}/${frozen.id}`)
      .send({ version: frozen.version, settings: { ...frozen.settings, discountRatePct: 9 } })
      .expect(409);
    assert.equal(parseError(refused).code, 'frozen');
    await f.agent
      .patch(`${base(f)}/${frozen.id}`)
      .send({ version: frozen.version, name: 'Bid sent' })
      .expect(200);
    await f.agent
      .post(`${base(f)}/${frozen.id}/freeze`)
      .send({})
      .expect(409);

    // The list's prices double: the live scenario changes, the frozen copy does not.
    const doubled = OPTIONS.map((o) => ({ ...o, installedPrice: (Number(o.installedPrice) * 2).toFixed(2) }));
    await f.agent.put(`/api/v1/equipment-lists/${f.listId}/options`).send({ version: 2, options: doubled }).expect(200);
    const live = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    const after = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${frozen.id}/sweep`).expect(200)).body);
    assert.deepEqual(after.rows, before.rows);
    const priced = (a: SweepAnswer) => a.rows.find((r) => r.installedPrice !== null)?.installedPrice;
    assert.equal(Number(priced(live)), 2 * Number(priced(before)));

    // The database refuses a change to a frozen copy's inputs even without the API.
    await assert.rejects(
      t
        .db('scenarios')
        .where({ id: frozen.id })
        .update({ settings: JSON.stringify({}) }),
      /frozen scenario/,
    );
  });

  it('keeps the chosen design point with the scenario: saved with its version, carried into a frozen copy, marked in both CSVs and listed', async () => {
    const f = await fixture(t);
    const s = await createScenario(f);
    const a = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    const r99 = a.rows.find((r) => r.label === '99 %');
    assert.ok(r99);
    assert.equal(s.chosenDesignC, null);

    // Bad input answers 400 with the field, and changes nothing.
    const bad = await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, chosenDesignC: 'cold' })
      .expect(400);
    assert.deepEqual(
      (parseError(bad).details ?? []).map((d) => d.path),
      ['chosenDesignC'],
    );
    await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, chosenDesignC: -90 })
      .expect(400);

    const saved = scenarioSchema.parse(
      (
        await f.agent
          .patch(`${base(f)}/${s.id}`)
          .send({ version: s.version, chosenDesignC: r99.designC })
          .expect(200)
      ).body,
    );
    assert.equal(saved.chosenDesignC, r99.designC);
    assert.equal(saved.version, s.version + 1);
    // A second tab with the old version is told, and its choice does not overwrite.
    await f.agent
      .patch(`${base(f)}/${s.id}`)
      .send({ version: s.version, chosenDesignC: -30 })
      .expect(409);
    const reloaded = scenarioSchema.parse((await f.agent.get(`${base(f)}/${s.id}`).expect(200)).body);
    assert.equal(reloaded.chosenDesignC, r99.designC);

    // The project's list shows what the chosen point installs and its price.
    const listed = scenarioListSchema.parse((await f.agent.get(base(f)).expect(200)).body).find((x) => x.id === s.id);
    assert.equal(listed?.chosenPoint?.label, '99 %');
    assert.equal(listed?.chosenPoint?.installedPrice, r99.installedPrice);
    assert.equal(listed?.chosenPoint?.unit, a.options.find((o) => o.id === r99.selectedOptionId)?.label);

    // The frozen copy keeps the bid's point and refuses a change to it.
    const frozen = scenarioSchema.parse(
      (
        await f.agent
          .post(`${base(f)}/${s.id}/freeze`)
          .send({})
          .expect(201)
      ).body,
    );
    assert.equal(frozen.chosenDesignC, r99.designC);
    const refused = await f.agent
      .patch(`${base(f)}/${frozen.id}`)
      .send({ version: frozen.version, chosenDesignC: -30 })
      .expect(409);
    assert.equal(parseError(refused).code, 'frozen');

    // Both CSVs mark the chosen row, under the glossary's column names.
    const one = (await f.agent.get(`${base(f)}/${frozen.id}/sweep.csv`).expect(200)).text.trim().split('\r\n');
    const header = one[0]?.split(',') ?? [];
    assert.deepEqual(header.slice(0, 5), [
      'scenario',
      'design_point',
      'design_temperature_c',
      'chosen',
      'design_load_w',
    ]);
    assert.ok(header.includes('lowest_indoor_c') && header.includes('equivalent_full_load_hours_per_year'));
    assert.ok(!header.some((h) => /rung|sag/.test(h)));
    const chosenCol = header.indexOf('chosen');
    const marked = one.slice(1).filter((l) => l.split(',')[chosenCol] === 'yes');
    assert.equal(marked.length, 1);
    assert.equal(marked[0]?.split(',')[1], '99 %');
    const cmp = await f.agent
      .get(`/api/v1/projects/${f.projectId}/scenario-comparison.csv`)
      .query({ ids: [s.id, frozen.id].join(',') })
      .expect(200);
    assert.equal(
      cmp.text
        .trim()
        .split('\r\n')
        .filter((l) => l.split(',')[chosenCol] === 'yes').length,
      2,
    );
    // The comparison carries the prices each scenario used.
    const json = comparisonSchema.parse(
      (
        await f.agent
          .get(`/api/v1/projects/${f.projectId}/scenario-comparison`)
          .query({ ids: [s.id, frozen.id].join(',') })
          .expect(200)
      ).body,
    );
    assert.deepEqual(
      json.entries.map((e) => e.prices),
      [PRICES, PRICES],
    );
  });

  it('compares two to five scenarios in JSON and CSV, with text cells guarded against formulas', async () => {
    const f = await fixture(t);
    const a = await createScenario(f, {
      name: '=HYPERLINK("http://x.test")',
      settings: { optionLabels: ['F 6 kW', 'F 9 kW', 'F 14 kW'] },
    });
    const b = await createScenario(f, { name: 'Heat pump', settings: { optionLabels: ['HP 2 t'] } });
    const c = await createScenario(f, { name: 'No list', equipmentListId: null });
    const url = `/api/v1/projects/${f.projectId}/scenario-comparison`;
    const res = await f.agent
      .get(url)
      .query({ ids: [a.id, b.id, c.id].join(',') })
      .expect(200);
    const cmp = comparisonSchema.parse(res.body);
    assert.deepEqual(
      cmp.entries.map((e) => e.scenario.name),
      [a.name, 'Heat pump', 'No list'],
    );
    assert.ok(cmp.entries[0]?.sweep && cmp.entries[1]?.sweep);
    assert.match(cmp.entries[2]?.problem ?? '', /equipment list/);
    await f.agent.get(url).query({ ids: a.id }).expect(400);
    await f.agent
      .get(url)
      .query({ ids: 'not-a-uuid,' + a.id })
      .expect(400);
    const csv = await f.agent
      .get(`${url}.csv`)
      .query({ ids: [a.id, b.id].join(',') })
      .expect(200);
    assert.match(csv.headers['content-type'] ?? '', /text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    assert.equal(lines[0]?.split(',')[0], 'scenario');
    assert.ok(
      lines.some((l) => l.startsWith(`"'=HYPERLINK(""http://x.test"")"`)),
      'formula guarded',
    );
    assert.ok(lines.some((l) => l.startsWith('Heat pump,99 %,')));
    assert.equal(lines[0]?.split(',')[1], 'design_point');
    const one = await f.agent.get(`${base(f)}/${b.id}/sweep.csv`).expect(200);
    assert.ok(one.text.split('\r\n').length > 10, 'every design temperature, grid included');
  });

  it('viewers read and sweep but cannot change; other organisations see 404', async () => {
    const f = await fixture(t);
    const s = await createScenario(f);
    const viewer = await inviteMember(t, { agent: f.agent }, 'viewer');
    await viewer.agent.get(base(f)).expect(200);
    await viewer.agent.post(`${base(f)}/${s.id}/sweep`).expect(200);
    await viewer.agent.post(base(f)).send({ name: 'No' }).expect(403);
    await viewer.agent
      .post(`${base(f)}/${s.id}/freeze`)
      .send({})
      .expect(403);
    const other = await signUp(t);
    await other.agent.get(`${base(f)}/${s.id}`).expect(404);
    await other.agent.post(`${base(f)}/${s.id}/sweep`).expect(404);
    await other.agent.get(base(f)).expect(404);
  });
});
