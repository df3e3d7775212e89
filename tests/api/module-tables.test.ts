/**
 * Each server area owns its tables (the `TABLES` export of its `*-repo.ts` files) and no other area
 * names them in a query (docs/architecture.md#layers-of-a-server-module). An area that needs another's
 * rows calls that area's service or repository; a statement that shows another area's names beside its
 * own rows, or reads its versions, joins the owner's read-only view (`peopleView`, `sitesView`,
 * `listsView`, `pricesView`, `projectsView`, `membershipsView`): a subquery the owner writes, so it stays
 * one statement and only the owner names its tables
 * (docs/architecture.md#read-only-views-of-another-areas-tables). The scan reads every file of
 * `server/modules/<area>/` for table names in string literals: a literal that is a table name
 * (`'projects'`, `'projects as p'`), or SQL text that reads or writes one (`FROM projects`,
 * `JOIN projects`). There are no exceptions.
 */
import assert from 'node:assert/strict';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, it } from 'node:test';

const ROOT = path.resolve(import.meta.dirname, '../..');
const MODULES = path.join(ROOT, 'server/modules');

/** Tables that belong to no area: the rate limiter's counters (server/http). */
const OUTSIDE_MODULES = new Set(['rate_limit_hits']);

function filesOf(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? filesOf(path.join(dir, e.name)) : e.name.endsWith('.ts') ? [path.join(dir, e.name)] : [],
  );
}

const areas = readdirSync(MODULES, { withFileTypes: true })
  .filter((e) => e.isDirectory())
  .map((e) => e.name);

/** Table → owning area, from the repositories' `TABLES` exports. */
async function ownership(): Promise<Map<string, string>> {
  const owners = new Map<string, string>();
  for (const area of areas) {
    for (const file of filesOf(path.join(MODULES, area)).filter((f) => f.endsWith('-repo.ts'))) {
      const mod = (await import(file)) as { TABLES?: readonly string[] };
      assert.ok(mod.TABLES, `${path.relative(ROOT, file)} declares the tables it owns (export const TABLES)`);
      for (const table of mod.TABLES) {
        assert.equal(owners.get(table) ?? area, area, `${table} is owned by ${owners.get(table) ?? ''} and by ${area}`);
        owners.set(table, area);
      }
    }
  }
  return owners;
}

/** The string literals of a TypeScript source (quoted and template), comments and field paths of error details left out. */
export function stringLiterals(source: string): string[] {
  const out: string[] = [];
  const re =
    /\/\/[^\n]*|\/\*[\s\S]*?\*\/|\bpath:\s*'[^'\n]*'|'((?:[^'\\\n]|\\.)*)'|"((?:[^"\\\n]|\\.)*)"|`((?:[^`\\]|\\.)*)`/g;
  for (const m of source.matchAll(re)) {
    const text = m[1] ?? m[2] ?? m[3];
    if (text !== undefined) out.push(text);
  }
  return out;
}

/** The tables a piece of source names in its queries. */
export function tablesNamed(source: string, tables: Iterable<string>): Set<string> {
  const found = new Set<string>();
  const literals = stringLiterals(source);
  for (const table of tables) {
    const whole = new RegExp(`^${table}(\\s+as\\s+\\w+)?$`, 'i');
    const inSql = new RegExp(`\\b(from|join|into|update|table)\\s+"?${table}"?(\\s|$|\\)|,)`, 'i');
    if (literals.some((l) => whole.test(l.trim()) || inSql.test(l))) found.add(table);
  }
  return found;
}

/** Every (file, table) where a file of one area names another area's table. */
function crossings(owners: Map<string, string>): { file: string; table: string }[] {
  const out: { file: string; table: string }[] = [];
  for (const area of areas) {
    for (const file of filesOf(path.join(MODULES, area))) {
      const named = tablesNamed(readFileSync(file, 'utf8'), owners.keys());
      for (const table of named) {
        if (owners.get(table) !== area) out.push({ file: path.relative(MODULES, file), table });
      }
    }
  }
  return out;
}

describe('tables and the areas that own them', () => {
  it('finds table names in queries and not in prose', () => {
    const source = [
      "db('projects as p').leftJoin('users as u', 'u.id', 'p.created_by');",
      'db.raw(`SELECT count(*) FROM equipment_options o WHERE o.id = ?`);',
      "query.leftJoin(reportsView(db).as('r'), 'r.id', 's.report_id').select('r.title as report_title');",
      '// a comment about scenarios and reports',
      "throw new HttpError(404, 'not_found', 'That project was not found; the projects page lists them', [{ path: 'projects', message: '' }]);",
    ].join('\n');
    assert.deepEqual(
      [...tablesNamed(source, ['projects', 'users', 'equipment_options', 'scenarios', 'reports'])].sort(),
      ['equipment_options', 'projects', 'users'],
    );
  });

  it('gives every table of the schema exactly one owning area', async () => {
    const owners = await ownership();
    const migrations = readdirSync(path.join(ROOT, 'migrations')).map((f) =>
      readFileSync(path.join(ROOT, 'migrations', f), 'utf8'),
    );
    const created = new Set(migrations.flatMap((m) => [...m.matchAll(/createTable\('(\w+)'/g)].map((x) => x[1] ?? '')));
    // Tables a later migration drops for good (their records moved elsewhere).
    created.delete('hourly_observations');
    created.add('session'); // made by the migration of the session store
    const unowned = [...created].filter((t) => !owners.has(t) && !OUTSIDE_MODULES.has(t)).sort();
    assert.deepEqual(unowned, [], 'tables without an owning area');
  });

  it('lets no area query another area’s tables', async () => {
    const owners = await ownership();
    assert.deepEqual(
      crossings(owners)
        .map((c) => `${c.file} → ${c.table}`)
        .sort(),
      [],
      'queries of another area’s tables',
    );
  });
});
