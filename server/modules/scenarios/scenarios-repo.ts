/** The tables of scenarios and of the sweep result cache, with their row mappers. */
import type { Knex } from 'knex';
import {
  scenarioSettingsSchema,
  type Scenario,
  type ScenarioSettings,
  type SweepAnswer,
} from '@shared/scenarios/scenario-schemas';
import { prepared } from '../../db';
import { peopleView } from '../auth/users-repo';
import { sitesView } from '../climate/climate-repo';
import { listsView, pricesView } from '../equipment/equipment-repo';
import { projectsView } from '../projects/projects-repo';

export const TABLES = ['scenarios', 'sweep_results'] as const;

/** A sweep answer without what depends on who asks and how (scenario id, cached, frozen). */
export type SweepAnswerBody = Omit<SweepAnswer, 'scenarioId' | 'cached' | 'frozen'>;

export interface ScenarioRow {
  id: string;
  organization_id: string;
  project_id: string;
  name: string;
  climate_site_id: string | null;
  equipment_list_id: string | null;
  settings: ScenarioSettings;
  frozen_at: Date | null;
  frozen_from_id: string | null;
  frozen_site_name: string | null;
  frozen_list_name: string | null;
  frozen_inputs: unknown;
  frozen_result: SweepAnswerBody | null;
  version: number;
  /** The sweep inputs' key, when the row was read with `joinInputsKey`. */
  inputs_key?: string;
}

export type ListedRow = ScenarioRow & {
  chosen_design_c: number | null;
  climate_site_name: string | null;
  equipment_list_name: string | null;
  updated_by_name: string | null;
  created_at: Date;
  updated_at: Date;
};

export const FORMER = 'A former member';

export function toScenario(r: ListedRow): Scenario {
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

/**
 * Everything that can change a scenario's sweep inputs moves one of these: the scenario's, project's,
 * list's and prices' versions, the site's last update and computation, and the references themselves.
 * `joinInputsKey` adds it as `inputs_key` to a query of `scenarios as s` that left-joins the climate
 * area's `sitesView` as `cs` and the equipment area's `listsView` as `el`, so that it comes with the
 * scenario row. It reads the other areas' versions through their read-only views in the same statement
 * on purpose: one round trip tells whether a prepared sweep can be reused.
 */
export function joinInputsKey<Q extends Knex.QueryBuilder>(db: Knex, query: Q): Q {
  return query
    .join(projectsView(db).as('p'), 'p.id', 's.project_id')
    .leftJoin(pricesView(db).as('ep'), 'ep.organization_id', 's.organization_id')
    .select(
      db.raw(
        'json_build_array(s.version, s.climate_site_id, s.equipment_list_id, p.version, el.version, ep.version, cs.updated_at, cs.computed_at)::text as inputs_key',
      ),
    ) as Q;
}

/** The sweep inputs' key of one scenario ('gone' when it no longer exists). */
export async function inputsKeyOf(db: Knex, scenarioId: string): Promise<string> {
  const query = withReferences(db, db('scenarios as s')).where('s.id', scenarioId);
  const r = await joinInputsKey(db, query).first<{ inputs_key: string } | undefined>();
  return r?.inputs_key ?? 'gone';
}

/** Left-joins the scenario's climate site as `cs` and equipment list as `el` (the other areas' views). */
function withReferences<Q extends Knex.QueryBuilder>(db: Knex, query: Q): Q {
  return query
    .leftJoin(sitesView(db).as('cs'), 'cs.id', 's.climate_site_id')
    .leftJoin(listsView(db).as('el'), 'el.id', 's.equipment_list_id') as Q;
}

/** A project's scenarios, with the names shown beside them and the key that tells whether their sweep inputs changed. */
function scenarioQuery(db: Knex, organizationId: string, projectId: string) {
  const query = withReferences(db, db('scenarios as s'))
    .leftJoin(peopleView(db).as('uu'), 'uu.id', 's.updated_by')
    .where({ 's.organization_id': organizationId, 's.project_id': projectId })
    .select<ListedRow[]>(
      's.*',
      'cs.name as climate_site_name',
      'el.name as equipment_list_name',
      'uu.name as updated_by_name',
    );
  return joinInputsKey(db, query);
}

export async function findScenario(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId: string,
): Promise<ListedRow | undefined> {
  const rows = await prepared(scenarioQuery(db, organizationId, projectId).andWhere('s.id', scenarioId));
  return rows[0];
}

/** A project's scenarios, oldest first. */
export function listScenarios(db: Knex, organizationId: string, projectId: string): Promise<ListedRow[]> {
  return scenarioQuery(db, organizationId, projectId).orderBy([
    { column: 's.created_at', order: 'asc' },
    { column: 's.id' },
  ]);
}

export function listScenariosByIds(
  db: Knex,
  organizationId: string,
  projectId: string,
  ids: readonly string[],
): Promise<ListedRow[]> {
  return scenarioQuery(db, organizationId, projectId).whereIn('s.id', ids);
}

/** A scenario's own row (without names or key), matching all of `where`. */
export function findScenarioRow(
  db: Knex,
  where: { id: string; organization_id?: string; project_id?: string },
): Promise<ScenarioRow | undefined> {
  return db('scenarios').where(where).first<ScenarioRow | undefined>('*');
}

/** The name and frozen time of each of these scenarios, by id. */
export async function scenarioLabels(
  db: Knex,
  ids: readonly string[],
): Promise<Map<string, { name: string; frozenAt: Date | null }>> {
  const wanted = [...new Set(ids)];
  const rows = wanted.length
    ? await db('scenarios')
        .whereIn('id', wanted)
        .select<{ id: string; name: string; frozen_at: Date | null }[]>('id', 'name', 'frozen_at')
    : [];
  return new Map(rows.map((r) => [r.id, { name: r.name, frozenAt: r.frozen_at }]));
}

export async function insertScenario(db: Knex, values: Record<string, unknown>): Promise<string> {
  const [row] = await db('scenarios').insert(values).returning<{ id: string }[]>('id');
  if (!row) throw new Error('scenario not created');
  return row.id;
}

/** Applies `update` to the scenario if it is still `version` (the version moves by one); false otherwise. */
export async function updateScenario(
  db: Knex,
  organizationId: string,
  id: string,
  version: number,
  update: Record<string, unknown>,
): Promise<boolean> {
  const n = await db('scenarios')
    .where({ id, organization_id: organizationId, version })
    .update({ ...update, updated_at: db.fn.now(), version: db.raw('version + 1') });
  return n > 0;
}

export async function deleteScenario(
  db: Knex,
  organizationId: string,
  projectId: string,
  id: string,
): Promise<boolean> {
  const n = await db('scenarios').where({ id, project_id: projectId, organization_id: organizationId }).delete();
  return n > 0;
}

/** A cached sweep result by its input hash. */
export function findResult(db: Knex, hash: string): Promise<{ result: SweepAnswerBody; used_at: Date } | undefined> {
  return db('sweep_results')
    .where({ input_hash: hash })
    .first<{ result: SweepAnswerBody; used_at: Date } | undefined>('result', 'used_at');
}

export async function touchResult(db: Knex, hash: string): Promise<void> {
  await db('sweep_results').where({ input_hash: hash }).update({ used_at: db.fn.now() });
}

export async function insertResult(db: Knex, hash: string, body: SweepAnswerBody): Promise<void> {
  await db('sweep_results')
    .insert({ input_hash: hash, result: JSON.stringify(body) })
    .onConflict('input_hash')
    .ignore();
}
