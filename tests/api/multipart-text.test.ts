/**
 * Text that arrives in a multipart upload's fields passes the same check as JSON bodies: a NUL or a
 * lone surrogate is a 400 naming the field, and nothing is stored.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { DEMO_SITES, generateDemoSeries, seriesToCsv } from '../../shared/climate/demo-weather';
import { parseError } from '../support/parse-body';
import { signUp, useTestApp } from '../support/test-app';

const t = useTestApp();
const site = DEMO_SITES[0];
if (!site) throw new Error('no demo site');
const csv = seriesToCsv(generateDemoSeries(site, { years: 2, endYear: 2023 }));

describe('text in multipart fields', () => {
  // A lone surrogate cannot travel as UTF-8 (the sender makes it U+FFFD); inside the mapping's JSON it can, as an escape.
  const cases: [string, string][] = [
    ['a NUL as a JSON escape', JSON.stringify({ time: 'time', dry_bulb_c: 'Te\u0000mp' })],
    ['a NUL as the character itself', '{"time": "time", "dry_bulb_c": "Te\u0000mp"}'],
    ['a lone high surrogate as a JSON escape', JSON.stringify({ time: 'time', dry_bulb_c: 'Temp\uD800' })],
    ['a lone low surrogate as a JSON escape', JSON.stringify({ time: 'time', dry_bulb_c: '\uDC00Temp' })],
  ];
  for (const [name, mapping] of cases) {
    it(`refuses ${name} in the column mapping with 400 and the field named, storing nothing`, async () => {
      const { agent } = await signUp(t);
      const created = await agent
        .post('/api/v1/climate-sites')
        .send({ name: 'Mapped', sourceKind: 'hourly', elevationM: 200 })
        .expect(201);
      const res = await agent
        .post(`/api/v1/climate-sites/${String(created.body.id)}/uploads`)
        .field('mapping', mapping)
        .attach('files', Buffer.from(csv), 'mapped.csv')
        .expect(400);
      const details = parseError(res).details ?? [];
      assert.ok(
        details.some((d) => d.path === 'mapping' || d.path.startsWith('mapping.')),
        JSON.stringify(details),
      );
      const uploads = await t.db('climate_uploads').count<{ n: string }[]>('* as n');
      assert.equal(Number(uploads[0]?.n), 0);
      await agent.get('/api/health').expect(200);
    });
  }
});
