/**
 * /api/v1/projects/:projectId/scenarios…: scenarios CRUD, duplicate, freeze, sweeps (run, read,
 * CSV) and the comparison of two to five scenarios (JSON, CSV).
 */
import { Router, type Response } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { csvLines, csvTextField } from '@shared/csv/csv-field';
import { csvColumn } from '@shared/glossary/glossary';
import { energyPricesSchema, type EnergyPrices } from '@shared/money/energy-prices';
import { chosenRowIndex } from '@shared/sweep/tradeoff-summary';
import {
  compareQuerySchema,
  scenarioCopySchema,
  scenarioInputSchema,
  scenarioPatchSchema,
  scenarioSettingsSchema,
  type Comparison,
  type Scenario,
  type ScenarioSettings,
  type SweepAnswer,
} from '@shared/scenarios/scenario-schemas';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError, staleUpdate } from '../../http/http-error';
import { prepared } from '../../db';
import { checkReferences } from '../../http/references';
import { computeSweep, joinInputsKey, prepareSweep, scenarioSweep, scenarioSweepJson, type ScenarioRow, type SweepJson } from './sweep-service';
import type { SweepPool } from './sweep-pool';

const FORMER = 'A former member';

type ListedRow = ScenarioRow & {
  chosen_design_c: number | null;
  climate_site_name: string | null;
  equipment_list_name: string | null;
  updated_by_name: string | null;
  created_at: Date;
  updated_at: Date;
};

function toScenario(r: ListedRow): Scenario {
  return {
    id: r.id,
    projectId: r.project_id,
    name: r.name,
    climateSiteId: r.climate_site_id,
    climateSiteName: r.frozen_at ? r.frozen_site_name : r.climate_site_name,
    equipmentListId: r.equipment_list_id,
    equipmentListName: r.frozen_at ? r.frozen_list_name : r.equipment_list_name,
    settings: scenarioSettingsSchema.parse(r.settings),
    frozenAt: r.frozen_at ? r.frozen_at.toISOString() : null,
    frozenFromId: r.frozen_from_id,
    chosenDesignC: r.chosen_design_c,
    chosenPoint: null,
    version: r.version,
    updatedByName: r.updated_by_name ?? FORMER,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

/** A project's scenarios, with the names shown beside them and the key that tells whether their sweep inputs changed. */
function scenarioQuery(db: Knex, organizationId: string, projectId: string) {
  const query = db('scenarios as s')
    .leftJoin('climate_sites as cs', 'cs.id', 's.climate_site_id')
    .leftJoin('equipment_lists as el', 'el.id', 's.equipment_list_id')
    .leftJoin('users as uu', 'uu.id', 's.updated_by')
    .where({ 's.organization_id': organizationId, 's.project_id': projectId })
    .select<ListedRow[]>('s.*', 'cs.name as climate_site_name', 'el.name as equipment_list_name', 'uu.name as updated_by_name');
  return joinInputsKey(db, query);
}

const projectParam = z.object({ projectId: z.uuid('Unknown project') });
const scenarioParams = z.object({ projectId: z.uuid('Unknown project'), scenarioId: z.uuid('Unknown scenario') });
const scenarioNotFound = () => new HttpError(404, 'not_found', 'That scenario was not found');
const frozenError = () =>
  new HttpError(409, 'frozen', 'This scenario is frozen for a bid: its inputs and results cannot change. Duplicate it to work on a copy.');

/** A serialised sweep answer; a GET whose If-None-Match names its tag gets 304. */
function sendSweepJson(res: Response, json: SweepJson): void {
  res.set('ETag', json.etag).type('json').send(json.bytes);
}

const bidDate = (d: Date) => d.toISOString().slice(0, 10);

export function scenariosRouter(db: Knex, pool: SweepPool, databaseUrl: string): Router {
  const router = Router();

  async function requireProject(organizationId: string, projectId: string) {
    const p = await db('projects')
      .where({ id: projectId, organization_id: organizationId })
      .first<{ id: string; climate_site_id: string | null; equipment_list_id: string | null } | undefined>(
        'id',
        'climate_site_id',
        'equipment_list_id',
      );
    if (!p) throw new HttpError(404, 'not_found', 'That project was not found');
    return p;
  }

  async function findScenario(organizationId: string, projectId: string, scenarioId: string): Promise<ListedRow> {
    const rows = await prepared(scenarioQuery(db, organizationId, projectId).andWhere('s.id', scenarioId));
    const row = rows[0];
    if (!row) throw scenarioNotFound();
    return row;
  }

  const sweepOf = (row: ScenarioRow, options: { onlyCached?: boolean } = {}) => scenarioSweep(db, pool, databaseUrl, row, options);

  router.get('/:projectId/scenarios', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { organizationId } = orgContext(req);
    await requireProject(organizationId, projectId);
    const rows = await scenarioQuery(db, organizationId, projectId).orderBy([
      { column: 's.created_at', order: 'asc' },
      { column: 's.id' },
    ]);
    res.json(await Promise.all(rows.map(async (r) => ({ ...toScenario(r), chosenPoint: await chosenPointOf(r) }))));
  });

  /** What the chosen design point installs, from the frozen result or the result cache (never a new run). */
  async function chosenPointOf(r: ListedRow): Promise<Scenario['chosenPoint']> {
    let answer: SweepAnswer | null;
    try {
      answer = await sweepOf(r, { onlyCached: true });
    } catch (error) {
      if (error instanceof HttpError && error.code === 'scenario_incomplete') return null;
      throw error;
    }
    const row = answer?.rows[chosenRowIndex(answer.rows, r.chosen_design_c)];
    if (!answer || !row) return null;
    const unit = row.selectedOptionId ? (answer.options.find((o) => o.id === row.selectedOptionId)?.label ?? null) : null;
    return { designC: row.designC, label: row.label, isGrid: row.isGrid, unit, installedPrice: row.installedPrice, currency: answer.currency };
  }

  router.post('/:projectId/scenarios', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const input = scenarioInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const project = await requireProject(organizationId, projectId);
    await checkReferences(db, organizationId, input);
    const settings: ScenarioSettings = input.settings ?? scenarioSettingsSchema.parse({});
    const [row] = await db('scenarios')
      .insert({
        organization_id: organizationId,
        project_id: projectId,
        name: input.name,
        climate_site_id: input.climateSiteId === undefined ? project.climate_site_id : input.climateSiteId,
        equipment_list_id: input.equipmentListId === undefined ? project.equipment_list_id : input.equipmentListId,
        settings: JSON.stringify(settings),
        created_by: user.id,
        updated_by: user.id,
      })
      .returning<{ id: string }[]>('id');
    const created = await findScenario(organizationId, projectId, row?.id ?? '');
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${created.id}`).json(toScenario(created));
  });

  router.get('/:projectId/scenarios/:scenarioId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    res.json(toScenario(await findScenario(orgContext(req).organizationId, projectId, scenarioId)));
  });

  router.patch('/:projectId/scenarios/:scenarioId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const patch = scenarioPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const current = await findScenario(organizationId, projectId, scenarioId);
    const changesInputs =
      patch.climateSiteId !== undefined || patch.equipmentListId !== undefined || patch.settings !== undefined || patch.chosenDesignC !== undefined;
    if (current.frozen_at && changesInputs) throw frozenError();
    await checkReferences(db, organizationId, patch);
    const update: Record<string, unknown> = { updated_by: user.id, updated_at: db.fn.now(), version: db.raw('version + 1') };
    if (patch.name !== undefined) update['name'] = patch.name;
    if (patch.climateSiteId !== undefined) update['climate_site_id'] = patch.climateSiteId;
    if (patch.equipmentListId !== undefined) update['equipment_list_id'] = patch.equipmentListId;
    if (patch.settings !== undefined) update['settings'] = JSON.stringify(patch.settings);
    if (patch.chosenDesignC !== undefined) update['chosen_design_c'] = patch.chosenDesignC;
    const n = await db('scenarios').where({ id: scenarioId, organization_id: organizationId, version: patch.version }).update(update);
    if (!n) throw staleUpdate(current.updated_by_name ?? FORMER, 'scenario');
    res.json(toScenario(await findScenario(organizationId, projectId, scenarioId)));
  });

  router.delete('/:projectId/scenarios/:scenarioId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const n = await db('scenarios')
      .where({ id: scenarioId, project_id: projectId, organization_id: orgContext(req).organizationId })
      .delete();
    if (!n) throw scenarioNotFound();
    res.status(204).end();
  });

  router.post('/:projectId/scenarios/:scenarioId/duplicate', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const { name } = scenarioCopySchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    const source = await findScenario(organizationId, projectId, scenarioId);
    const [row] = await db('scenarios')
      .insert({
        organization_id: organizationId,
        project_id: projectId,
        name: name ?? `${source.name} (copy)`.slice(0, 160),
        climate_site_id: source.climate_site_id,
        equipment_list_id: source.equipment_list_id,
        settings: JSON.stringify(source.settings),
        chosen_design_c: source.chosen_design_c,
        created_by: user.id,
        updated_by: user.id,
      })
      .returning<{ id: string }[]>('id');
    const copy = await findScenario(organizationId, projectId, row?.id ?? '');
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${copy.id}`).json(toScenario(copy));
  });

  /** Freezing takes an immutable dated copy with the inputs and the result of this moment; the scenario itself stays editable. */
  router.post('/:projectId/scenarios/:scenarioId/freeze', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const { name } = scenarioCopySchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    const source = await findScenario(organizationId, projectId, scenarioId);
    if (source.frozen_at) throw new HttpError(409, 'frozen', 'This scenario is already a frozen copy');
    const prepared = await prepareSweep(db, source);
    const out = await computeSweep(db, pool, databaseUrl, prepared);
    if (!out) throw new Error('sweep missing after a run');
    const now = new Date();
    const [row] = await db('scenarios')
      .insert({
        organization_id: organizationId,
        project_id: projectId,
        name: name ?? `${source.name} · bid ${bidDate(now)}`.slice(0, 160),
        climate_site_id: source.climate_site_id,
        equipment_list_id: source.equipment_list_id,
        // The prices of this moment, so that a copy of the bid prices the same way.
        settings: JSON.stringify({ ...source.settings, prices: prepared.prices }),
        frozen_at: now,
        frozen_from_id: source.id,
        frozen_site_name: prepared.meta.climateSiteName,
        frozen_list_name: prepared.meta.equipmentListName,
        frozen_inputs: JSON.stringify({ hash: prepared.hash, ...prepared.task }),
        frozen_result: JSON.stringify(out.body),
        // The design point of the bid.
        chosen_design_c: source.chosen_design_c,
        created_by: user.id,
        updated_by: user.id,
      })
      .returning<{ id: string }[]>('id');
    const frozen = await findScenario(organizationId, projectId, row?.id ?? '');
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${frozen.id}`).json(toScenario(frozen));
  });

  router.post('/:projectId/scenarios/:scenarioId/sweep', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const json = await scenarioSweepJson(db, pool, databaseUrl, await findScenario(orgContext(req).organizationId, projectId, scenarioId));
    if (!json) throw new Error('sweep missing after a run');
    sendSweepJson(res, json);
  });

  /** The cached sweep only (404 `not_computed` when the current inputs have not been swept yet). */
  router.get('/:projectId/scenarios/:scenarioId/sweep', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const json = await scenarioSweepJson(db, pool, databaseUrl, await findScenario(orgContext(req).organizationId, projectId, scenarioId), {
      onlyCached: true,
    });
    if (!json) throw new HttpError(404, 'not_computed', 'This scenario has not been swept with its current inputs yet');
    sendSweepJson(res, json);
  });

  router.get('/:projectId/scenarios/:scenarioId/sweep.csv', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const row = await findScenario(orgContext(req).organizationId, projectId, scenarioId);
    const answer = await sweepOf(row);
    if (!answer) throw new Error('sweep missing after a run');
    sendCsv(res, `${row.name}-sweep.csv`, csvLines([SWEEP_CSV_HEADER, ...sweepCsvRows(row.name, answer, row.chosen_design_c, false)]));
  });

  /** The prices a scenario is swept with: its own, or the organisation's. */
  async function pricesOf(organizationId: string, r: ListedRow): Promise<EnergyPrices | null> {
    if (r.settings.prices) return r.settings.prices;
    const row = await db('energy_prices').where({ organization_id: organizationId }).first<{ prices: unknown } | undefined>('prices');
    const parsed = energyPricesSchema.safeParse(row?.prices);
    return parsed.success ? parsed.data : null;
  }

  async function comparison(organizationId: string, projectId: string, ids: string[]): Promise<Comparison> {
    await requireProject(organizationId, projectId);
    const rows = await scenarioQuery(db, organizationId, projectId).whereIn('s.id', ids);
    const byId = new Map(rows.map((r) => [r.id, r]));
    const missing = ids.filter((id) => !byId.has(id));
    if (missing.length > 0) throw new HttpError(404, 'not_found', 'Some of these scenarios were not found', [{ path: 'ids', message: `Unknown scenario: ${missing.join(', ')}` }]);
    const entries: Comparison['entries'] = [];
    for (const id of ids) {
      const r = byId.get(id);
      if (!r) continue;
      try {
        entries.push({ scenario: toScenario(r), sweep: await sweepOf(r), problem: null, prices: await pricesOf(organizationId, r) });
      } catch (error) {
        if (!(error instanceof HttpError) || error.code !== 'scenario_incomplete') throw error;
        entries.push({ scenario: toScenario(r), sweep: null, problem: error.message, prices: null });
      }
    }
    return { entries };
  }

  router.get('/:projectId/scenario-comparison', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { ids } = compareQuerySchema.parse(req.query);
    res.json(await comparison(orgContext(req).organizationId, projectId, ids));
  });

  router.get('/:projectId/scenario-comparison.csv', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { ids } = compareQuerySchema.parse(req.query);
    const { entries } = await comparison(orgContext(req).organizationId, projectId, ids);
    const lines = [SWEEP_CSV_HEADER];
    for (const e of entries) if (e.sweep) lines.push(...sweepCsvRows(e.scenario.name, e.sweep, e.scenario.chosenDesignC, true));
    sendCsv(res, 'scenario-comparison.csv', csvLines(lines));
  });

  return router;
}

/** Column names from the glossary, so that an export names each figure as the screens do. */
const SWEEP_CSV_HEADER = [
  'scenario',
  csvColumn('designPoint'),
  csvColumn('designTemperature'),
  'chosen',
  csvColumn('designLoad'),
  csvColumn('unit'),
  csvColumn('capacityAtDesign'),
  csvColumn('installedPrice'),
  csvColumn('annualEnergy'),
  csvColumn('annualCost'),
  csvColumn('runHours'),
  csvColumn('unmetHours'),
  csvColumn('unmetHoursWorstYear'),
  csvColumn('unmetDegreeHours'),
  csvColumn('indoorDrop'),
  csvColumn('lowestIndoor'),
  csvColumn('lifeCycleCost'),
  'currency',
  'note',
  'climate_basis',
];

const num = (v: number | null, digits: number) => (v === null ? '' : String(Number(v.toFixed(digits))));

/** A sweep's rows as CSV (the comparison: named values and the chosen point only); the chosen point says "yes". */
function sweepCsvRows(scenarioName: string, a: SweepAnswer, chosenDesignC: number | null, namedOnly: boolean): string[][] {
  const labels = new Map(a.options.map((o) => [o.id, o.label]));
  const chosen = a.rows[chosenRowIndex(a.rows, chosenDesignC)];
  return a.rows
    .filter((r) => !namedOnly || !r.isGrid || r === chosen)
    .map((r) => [
      csvTextField(scenarioName),
      csvTextField(r.label),
      num(r.designC, 2),
      r === chosen ? 'yes' : '',
      num(r.designLoadW, 0),
      csvTextField(r.selectedOptionId ? (labels.get(r.selectedOptionId) ?? r.selectedOptionId) : ''),
      num(r.capacityAtDesignW, 0),
      r.installedPrice ?? '',
      num(r.annualEnergyKWh, 1),
      r.annualCost ?? '',
      num(r.runHoursPerYear, 1),
      num(r.unmetHoursPerYear, 2),
      num(r.unmetHoursWorstYear, 0),
      num(r.unmetDegreeHoursPerYear, 1),
      num(r.worstSagC, 2),
      r.worstSagC === null ? '' : num(a.indoorDesignC - r.worstSagC, 2),
      r.lifeCycleCost ?? '',
      a.currency,
      csvTextField(r.selectionReason ?? r.costUnavailableReason ?? r.unavailableReason ?? ''),
      csvTextField([a.climateBasis?.description, a.climateBasis?.estimateLabel].filter(Boolean).join('. ')),
    ]);
}

function sendCsv(res: Response, fileName: string, body: string): void {
  const safe = fileName.replace(/[^\w.-]+/g, '-').replace(/-+/g, '-');
  res
    .type('text/csv; charset=utf-8')
    .set('Content-Disposition', `attachment; filename="${safe}"`)
    .send(body);
}
