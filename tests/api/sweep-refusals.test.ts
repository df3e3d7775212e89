/**
 * Bad scenarios through the API: every refusal is a 4xx naming the field, and nothing is stored
 * (docs/methods.md#bad-input). Option ids come from list positions here, so duplicates cannot arise.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { projectBuildingAnswerSchema } from '../../shared/building/building-schemas';
import { equipmentListSchema } from '../../shared/equipment/equipment-schemas';
import {
  type Scenario,
  scenarioListSchema,
  scenarioSchema,
  sweepAnswerSchema,
} from '../../shared/scenarios/scenario-schemas';
import { type AnswerLike, parseBody, parseError } from '../support/parse-body';
import { BUILDING, OPTIONS, fixture, type Fixture } from '../support/scenario-fixture';
import { useTestApp } from '../support/test-app';

const t = useTestApp();

const base = (f: Fixture) => `/api/v1/projects/${f.projectId}/scenarios`;
const details = (res: AnswerLike) => parseError(res).details ?? [];

async function createScenario(f: Fixture, settings: Record<string, unknown> = {}): Promise<Scenario> {
  return scenarioSchema.parse((await f.agent.post(base(f)).send({ name: 'Bid', settings }).expect(201)).body);
}

const sweepRows = async (): Promise<number> =>
  Number((await t.db('sweep_results').count<{ count: string }[]>('* as count'))[0]?.count ?? 0);

describe('bad scenarios through the API', () => {
  it('refuses new settings out of range with field details, and creates nothing', async () => {
    const f = await fixture(t);
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ extraDesignC: [-300] }, 'settings.extraDesignC.0', /at least −60 °C/],
      [{ extraDesignC: [80] }, 'settings.extraDesignC.0', /at most 20 °C/],
      [{ heatPumpSizing: 'biggest' }, 'settings.heatPumpSizing', /compressor alone or with the backup heat/],
      [{ studyPeriodYears: 0 }, 'settings.studyPeriodYears', /at least 1 year/],
      [{ energyEscalationPctPerYear: 50 }, 'settings.energyEscalationPctPerYear', /at most 20 %/],
      [{ equipmentFamily: 'wood' }, 'settings.equipmentFamily', /fuel-fired, heat pump or electric/],
    ];
    for (const [settings, path, message] of cases) {
      const res = await f.agent.post(base(f)).send({ name: 'Bid', settings }).expect(400);
      const d = details(res).find((x) => x.path === path);
      assert.ok(d, `${JSON.stringify(settings)} → ${JSON.stringify(details(res))}`);
      assert.match(d.message, message);
    }
    assert.equal(parseBody(scenarioListSchema, await f.agent.get(base(f)).expect(200)).length, 0);
  });

  it('refuses a COP below 1 and a UA of 0 with the field named; the list and the building stay as they were', async () => {
    const f = await fixture(t);
    const hp = OPTIONS[3];
    assert.ok(hp?.kind === 'heat-pump');
    const bad = await f.agent
      .put(`/api/v1/equipment-lists/${f.listId}/options`)
      .send({ version: 2, options: [...OPTIONS.slice(0, 3), { ...hp, copM8_3: 0.8 }] })
      .expect(400);
    assert.ok(
      details(bad).some((d) => d.path === 'options.3.copM8_3' && d.message.includes('at least 1')),
      JSON.stringify(details(bad)),
    );
    const list = parseBody(equipmentListSchema, await f.agent.get(`/api/v1/equipment-lists/${f.listId}`).expect(200));
    const storedHp = list.options[3];
    assert.ok(storedHp?.kind === 'heat-pump', 'the fourth option is still the heat pump');
    assert.equal(storedHp.copM8_3, 2.5);

    const ua = await f.agent
      .put(`/api/v1/projects/${f.projectId}/building`)
      .send({ version: 2, building: { ...BUILDING, conduction: { mode: 'ua', uaWPerK: 0 } } })
      .expect(400);
    assert.ok(
      details(ua).some((d) => d.path === 'building.conduction.uaWPerK' && d.message.includes('greater than 0 W/K')),
      JSON.stringify(details(ua)),
    );
    const stored = parseBody(
      projectBuildingAnswerSchema,
      await f.agent.get(`/api/v1/projects/${f.projectId}/building`).expect(200),
    );
    const conduction = stored.building?.conduction;
    assert.ok(conduction?.mode === 'ua', 'the building keeps its UA');
    assert.equal(conduction.uaWPerK, 150);
  });

  it('a fuel without a price and an extra design temperature above the indoor one answer 422 and store no sweep', async () => {
    const f = await fixture(t);
    const before = await sweepRows();
    await f.agent
      .put('/api/v1/energy-prices')
      .send({ version: 1, prices: { currency: 'USD', electricityPerKwh: '0.1600' } })
      .expect(200);
    // Indoor 18 °C: an extra design temperature of 17.5 °C is less than 1 K below it.
    await f.agent
      .put(`/api/v1/projects/${f.projectId}/building`)
      .send({ version: 2, building: { ...BUILDING, indoorDesignC: 18 } })
      .expect(200);
    const s = await createScenario(f, { extraDesignC: [17.5] });
    const res = await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(422);
    assert.equal(parseError(res).code, 'scenario_incomplete');
    const d = details(res);
    assert.ok(
      d.some(
        (x) =>
          x.path === 'settings.prices' &&
          x.message.includes('Enter a gas price: "F 6 kW", "F 9 kW", "F 14 kW" use gas'),
      ),
      JSON.stringify(d),
    );
    assert.ok(
      d.some((x) => x.path === 'settings.extraDesignC.0' && x.message.includes('at most 17 °C')),
      JSON.stringify(d),
    );
    assert.equal(await sweepRows(), before);
  });

  it('a scenario of one family sweeps only that family, under the compressor rule by default, with the study period stated', async () => {
    const f = await fixture(t);
    const s = await createScenario(f, { equipmentFamily: 'heat-pump', studyPeriodYears: 25 });
    const answer = sweepAnswerSchema.parse((await f.agent.post(`${base(f)}/${s.id}/sweep`).expect(200)).body);
    assert.deepEqual(
      answer.options.map((o) => o.kind),
      ['heat-pump'],
    );
    assert.equal(answer.heatPumpSizing, 'compressor');
    assert.equal(answer.selectionRule, 'smallest-capacity');
    assert.equal(answer.studyPeriodYears, 25);
    // Four years of record: the warnings say what that means.
    assert.ok(answer.warnings.some((w) => w.code === 'short-record'));
    for (const r of answer.rows.filter((x) => x.selectedOptionId !== null)) {
      assert.ok((r.compressorAtDesignW ?? 0) >= r.designLoadW, `${r.label}: the compressor covers the design load`);
      assert.ok(r.backupHoursPerYear !== null && r.backupEnergyKWh !== null && r.lowestIndoorC !== null);
      assert.equal(r.worstSagC, r.worstDropK);
    }
    const mixed = sweepAnswerSchema.parse(
      (await f.agent.post(`${base(f)}/${(await createScenario(f)).id}/sweep`).expect(200)).body,
    );
    assert.equal(mixed.selectionRule, 'lowest-life-cycle-cost');
    assert.ok(mixed.warnings.some((w) => w.code === 'mixed-families'));
  });
});
