/**
 * /api/v1/projects/:projectId/scenarios…: scenarios CRUD, duplicate, freeze, sweeps (run, read,
 * CSV) and the comparison of two to five scenarios (JSON, CSV).
 */
import { Router, type Response } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { csvLines, csvTextField } from '@shared/csv/csv-field';
import { csvColumn } from '@shared/glossary/glossary';
import { chosenRowIndex } from '@shared/sweep/tradeoff-summary';
import {
  compareQuerySchema,
  scenarioCopySchema,
  scenarioInputSchema,
  scenarioPatchSchema,
  type SweepAnswer,
} from '@shared/scenarios/scenario-schemas';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import * as scenarios from './scenarios-service';
import type { SweepJson } from './sweep-service';
import type { SweepPool } from './sweep-pool';

const projectParam = z.object({ projectId: z.uuid('Unknown project') });
const scenarioParams = z.object({ projectId: z.uuid('Unknown project'), scenarioId: z.uuid('Unknown scenario') });

/** A serialised sweep answer; a GET whose If-None-Match names its tag gets 304. */
function sendSweepJson(res: Response, json: SweepJson): void {
  res.set('ETag', json.etag).type('json').send(json.bytes);
}

export function scenariosRouter(db: Knex, pool: SweepPool, databaseUrl: string): Router {
  const router = Router();
  const runner: scenarios.SweepRunner = { pool, databaseUrl };

  router.get('/:projectId/scenarios', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    res.json(await scenarios.listScenarios(db, runner, orgContext(req).organizationId, projectId));
  });

  router.post('/:projectId/scenarios', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const input = scenarioInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await scenarios.createScenario(db, organizationId, user.id, projectId, input);
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${created.id}`).json(created);
  });

  router.get('/:projectId/scenarios/:scenarioId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    res.json(await scenarios.getScenario(db, orgContext(req).organizationId, projectId, scenarioId));
  });

  router.patch('/:projectId/scenarios/:scenarioId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const patch = scenarioPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await scenarios.patchScenario(db, organizationId, user.id, projectId, scenarioId, patch));
  });

  router.delete('/:projectId/scenarios/:scenarioId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    await scenarios.deleteScenario(db, orgContext(req).organizationId, projectId, scenarioId);
    res.status(204).end();
  });

  router.post('/:projectId/scenarios/:scenarioId/duplicate', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const copyInput = scenarioCopySchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    const copy = await scenarios.duplicateScenario(db, organizationId, user.id, projectId, scenarioId, copyInput);
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${copy.id}`).json(copy);
  });

  /** Freezing takes an immutable dated copy with the inputs and the result of this moment; the scenario itself stays editable. */
  router.post('/:projectId/scenarios/:scenarioId/freeze', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const copyInput = scenarioCopySchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    const frozen = await scenarios.freezeScenario(
      db,
      runner,
      organizationId,
      user.id,
      projectId,
      scenarioId,
      copyInput,
    );
    res.status(201).location(`/api/v1/projects/${projectId}/scenarios/${frozen.id}`).json(frozen);
  });

  router.post('/:projectId/scenarios/:scenarioId/sweep', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const json = await scenarios.sweepJsonOf(db, runner, orgContext(req).organizationId, projectId, scenarioId);
    if (!json) throw new Error('sweep missing after a run');
    sendSweepJson(res, json);
  });

  /** The cached sweep only (404 `not_computed` when the current inputs have not been swept yet). */
  router.get('/:projectId/scenarios/:scenarioId/sweep', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const json = await scenarios.sweepJsonOf(db, runner, orgContext(req).organizationId, projectId, scenarioId, {
      onlyCached: true,
    });
    if (!json) throw new HttpError(404, 'not_computed', 'This scenario has not been swept with its current inputs yet');
    sendSweepJson(res, json);
  });

  router.get('/:projectId/scenarios/:scenarioId/sweep.csv', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, scenarioId } = scenarioParams.parse(req.params);
    const { row, answer } = await scenarios.scenarioWithSweep(
      db,
      runner,
      orgContext(req).organizationId,
      projectId,
      scenarioId,
    );
    sendCsv(
      res,
      `${row.name}-sweep.csv`,
      csvLines([SWEEP_CSV_HEADER, ...sweepCsvRows(row.name, answer, row.chosen_design_c, false)]),
    );
  });

  router.get('/:projectId/scenario-comparison', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { ids } = compareQuerySchema.parse(req.query);
    res.json(await scenarios.comparison(db, runner, orgContext(req).organizationId, projectId, ids));
  });

  router.get('/:projectId/scenario-comparison.csv', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { ids } = compareQuerySchema.parse(req.query);
    const { entries } = await scenarios.comparison(db, runner, orgContext(req).organizationId, projectId, ids);
    const lines = [SWEEP_CSV_HEADER];
    for (const e of entries)
      if (e.sweep) lines.push(...sweepCsvRows(e.scenario.name, e.sweep, e.scenario.chosenDesignC, true));
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
function sweepCsvRows(
  scenarioName: string,
  a: SweepAnswer,
  chosenDesignC: number | null,
  namedOnly: boolean,
): string[][] {
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
  res.type('text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="${safe}"`).send(body);
}
