/**
 * Scenarios of a project: versioned edits (a frozen copy for a bid refuses changes to its inputs),
 * duplicates, freezing, the chosen design point, and the comparison of two to five scenarios.
 */
import type { Knex } from 'knex';
import type { z } from 'zod';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { chosenRowIndex } from '@shared/sweep/tradeoff-summary';
import {
  scenarioSettingsSchema,
  type Comparison,
  type Scenario,
  type scenarioCopySchema,
  type scenarioInputSchema,
  type scenarioPatchSchema,
  type ScenarioSettings,
  type SweepAnswer,
} from '@shared/scenarios/scenario-schemas';
import { HttpError, staleUpdate } from '../../http/http-error';
import { organizationPrices } from '../equipment/equipment-service';
import { checkReferences, projectInOrganization } from '../projects/projects-service';
import * as repo from './scenarios-repo';
import { computeSweep, prepareSweep, scenarioSweep, scenarioSweepJson, type SweepJson } from './sweep-service';
import type { SweepPool } from './sweep-pool';

export type { ListedRow } from './scenarios-repo';

type ScenarioInput = z.output<typeof scenarioInputSchema>;
type ScenarioPatch = z.output<typeof scenarioPatchSchema>;
type ScenarioCopy = z.output<typeof scenarioCopySchema>;

/** What a sweep needs besides the database: the worker pool and the database address its workers open. */
export interface SweepRunner {
  pool: SweepPool;
  databaseUrl: string;
}

export const scenarioNotFound = () => new HttpError(404, 'not_found', 'That scenario was not found');
const frozenError = () =>
  new HttpError(
    409,
    'frozen',
    'This scenario is frozen for a bid: its inputs and results cannot change. Duplicate it to work on a copy.',
  );

const bidDate = (d: Date) => d.toISOString().slice(0, 10);

/** The scenario of the project in the organisation, or 404. */
export async function findScenario(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId: string,
): Promise<repo.ListedRow> {
  const row = await repo.findScenario(db, organizationId, projectId, scenarioId);
  if (!row) throw scenarioNotFound();
  return row;
}

/** A scenario's own row by id, in the organisation (and project, when given). */
export function findScenarioRow(
  db: Knex,
  where: { id: string; organization_id?: string; project_id?: string },
): Promise<repo.ScenarioRow | undefined> {
  return repo.findScenarioRow(db, where);
}

export const scenarioLabels = repo.scenarioLabels;

/** What the chosen design point installs, from the frozen result or the result cache (never a new run). */
async function chosenPointOf(db: Knex, runner: SweepRunner, r: repo.ListedRow): Promise<Scenario['chosenPoint']> {
  let answer: SweepAnswer | null;
  try {
    answer = await scenarioSweep(db, runner.pool, runner.databaseUrl, r, { onlyCached: true });
  } catch (error) {
    if (error instanceof HttpError && error.code === 'scenario_incomplete') return null;
    throw error;
  }
  const row = answer?.rows[chosenRowIndex(answer.rows, r.chosen_design_c)];
  if (!answer || !row) return null;
  const unit = row.selectedOptionId ? (answer.options.find((o) => o.id === row.selectedOptionId)?.label ?? null) : null;
  return {
    designC: row.designC,
    label: row.label,
    isGrid: row.isGrid,
    unit,
    installedPrice: row.installedPrice,
    currency: answer.currency,
  };
}

export async function listScenarios(
  db: Knex,
  runner: SweepRunner,
  organizationId: string,
  projectId: string,
): Promise<Scenario[]> {
  await projectInOrganization(db, organizationId, projectId);
  const rows = await repo.listScenarios(db, organizationId, projectId);
  return Promise.all(
    rows.map(async (r) => ({ ...repo.toScenario(r), chosenPoint: await chosenPointOf(db, runner, r) })),
  );
}

export async function getScenario(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId: string,
): Promise<Scenario> {
  return repo.toScenario(await findScenario(db, organizationId, projectId, scenarioId));
}

export async function createScenario(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
  input: ScenarioInput,
): Promise<Scenario> {
  const project = await projectInOrganization(db, organizationId, projectId);
  await checkReferences(db, organizationId, input);
  const settings: ScenarioSettings = input.settings ?? scenarioSettingsSchema.parse({});
  const id = await repo.insertScenario(db, {
    organization_id: organizationId,
    project_id: projectId,
    name: input.name,
    climate_site_id: input.climateSiteId === undefined ? project.climateSiteId : input.climateSiteId,
    equipment_list_id: input.equipmentListId === undefined ? project.equipmentListId : input.equipmentListId,
    settings: JSON.stringify(settings),
    created_by: userId,
    updated_by: userId,
  });
  return getScenario(db, organizationId, projectId, id);
}

export async function patchScenario(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
  scenarioId: string,
  patch: ScenarioPatch,
): Promise<Scenario> {
  const current = await findScenario(db, organizationId, projectId, scenarioId);
  const changesInputs =
    patch.climateSiteId !== undefined ||
    patch.equipmentListId !== undefined ||
    patch.settings !== undefined ||
    patch.chosenDesignC !== undefined;
  if (current.frozen_at && changesInputs) throw frozenError();
  await checkReferences(db, organizationId, patch);
  const update: Record<string, unknown> = { updated_by: userId };
  if (patch.name !== undefined) update['name'] = patch.name;
  if (patch.climateSiteId !== undefined) update['climate_site_id'] = patch.climateSiteId;
  if (patch.equipmentListId !== undefined) update['equipment_list_id'] = patch.equipmentListId;
  if (patch.settings !== undefined) update['settings'] = JSON.stringify(patch.settings);
  if (patch.chosenDesignC !== undefined) update['chosen_design_c'] = patch.chosenDesignC;
  if (!(await repo.updateScenario(db, organizationId, scenarioId, patch.version, update)))
    throw staleUpdate(current.updated_by_name ?? repo.FORMER, 'scenario');
  return getScenario(db, organizationId, projectId, scenarioId);
}

export async function deleteScenario(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId: string,
): Promise<void> {
  if (!(await repo.deleteScenario(db, organizationId, projectId, scenarioId))) throw scenarioNotFound();
}

export async function duplicateScenario(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
  scenarioId: string,
  { name }: ScenarioCopy,
): Promise<Scenario> {
  const source = await findScenario(db, organizationId, projectId, scenarioId);
  const id = await repo.insertScenario(db, {
    organization_id: organizationId,
    project_id: projectId,
    name: name ?? `${source.name} (copy)`.slice(0, 160),
    climate_site_id: source.climate_site_id,
    equipment_list_id: source.equipment_list_id,
    settings: JSON.stringify(source.settings),
    chosen_design_c: source.chosen_design_c,
    created_by: userId,
    updated_by: userId,
  });
  return getScenario(db, organizationId, projectId, id);
}

/** Freezing takes an immutable dated copy with the inputs and the result of this moment; the scenario itself stays editable. */
export async function freezeScenario(
  db: Knex,
  runner: SweepRunner,
  organizationId: string,
  userId: string,
  projectId: string,
  scenarioId: string,
  { name }: ScenarioCopy,
): Promise<Scenario> {
  const source = await findScenario(db, organizationId, projectId, scenarioId);
  if (source.frozen_at) throw new HttpError(409, 'frozen', 'This scenario is already a frozen copy');
  const prepared = await prepareSweep(db, source);
  const out = await computeSweep(db, runner.pool, runner.databaseUrl, prepared);
  if (!out) throw new Error('sweep missing after a run');
  const now = new Date();
  const id = await repo.insertScenario(db, {
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
    created_by: userId,
    updated_by: userId,
  });
  return getScenario(db, organizationId, projectId, id);
}

/** The scenario's sweep, serialised (null: `onlyCached` and not swept with its current inputs yet). */
export async function sweepJsonOf(
  db: Knex,
  runner: SweepRunner,
  organizationId: string,
  projectId: string,
  scenarioId: string,
  options: { onlyCached?: boolean } = {},
): Promise<SweepJson | null> {
  return scenarioSweepJson(
    db,
    runner.pool,
    runner.databaseUrl,
    await findScenario(db, organizationId, projectId, scenarioId),
    options,
  );
}

/** The scenario and its sweep (run now when it is not cached). */
export async function scenarioWithSweep(
  db: Knex,
  runner: SweepRunner,
  organizationId: string,
  projectId: string,
  scenarioId: string,
): Promise<{ row: repo.ListedRow; answer: SweepAnswer }> {
  const row = await findScenario(db, organizationId, projectId, scenarioId);
  const answer = await scenarioSweep(db, runner.pool, runner.databaseUrl, row);
  if (!answer) throw new Error('sweep missing after a run');
  return { row, answer };
}

/** The prices a scenario is swept with: its own, or the organisation's. */
async function pricesOf(db: Knex, organizationId: string, r: repo.ListedRow): Promise<EnergyPrices | null> {
  if (r.settings.prices) return r.settings.prices;
  return organizationPrices(db, organizationId);
}

export async function comparison(
  db: Knex,
  runner: SweepRunner,
  organizationId: string,
  projectId: string,
  ids: string[],
): Promise<Comparison> {
  await projectInOrganization(db, organizationId, projectId);
  const rows = await repo.listScenariosByIds(db, organizationId, projectId, ids);
  const byId = new Map(rows.map((r) => [r.id, r]));
  const missing = ids.filter((id) => !byId.has(id));
  if (missing.length > 0)
    throw new HttpError(404, 'not_found', 'Some of these scenarios were not found', [
      { path: 'ids', message: `Unknown scenario: ${missing.join(', ')}` },
    ]);
  const entries: Comparison['entries'] = [];
  for (const id of ids) {
    const r = byId.get(id);
    if (!r) continue;
    try {
      entries.push({
        scenario: repo.toScenario(r),
        sweep: await scenarioSweep(db, runner.pool, runner.databaseUrl, r),
        problem: null,
        prices: await pricesOf(db, organizationId, r),
      });
    } catch (error) {
      if (!(error instanceof HttpError) || error.code !== 'scenario_incomplete') throw error;
      entries.push({ scenario: repo.toScenario(r), sweep: null, problem: error.message, prices: null });
    }
  }
  return { entries };
}
