import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { climateSiteListSchema, climateSiteSchema, climateUploadSchema } from '../../shared/climate/climate-schemas';
import { DEMO_SITES, generateDemoSeries, seriesToCsv, seriesToIsdLite } from '../../shared/climate/demo-weather';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { parseWeatherText } from '../../shared/climate/readers';
import { parseBody, parseError } from '../support/parse-body';
import { signUp, useTestApp, inviteMember } from '../support/test-app';

const t = useTestApp();

const site = DEMO_SITES[0]!;
const threeYears = generateDemoSeries(site, { years: 3, endYear: 2023 });
const csv = seriesToCsv(threeYears);

const published = {
  source: 'Typed in from a published design-conditions table (test)',
  heating: { db99_6: -28.4, db99: -25.1 },
  extremeMin: { mean: -34.2, sd: 3.1 },
};

async function hourlySite(agent: request.Agent, elevationM: number | null = site.elevationM) {
  const res = await agent
    .post('/api/v1/climate-sites')
    .send({ name: 'Upload test', sourceKind: 'hourly', elevationM })
    .expect(201);
  return parseBody(climateSiteSchema, res).id;
}

const count = async (table: string) => (await t.db(table).count<{ n: number }[]>('* as n'))[0]?.n;
/** Hours of every stored hourly record. */
const storedHours = async () =>
  Number((await t.db('climate_records').sum<{ n: string | null }[]>('hour_count as n'))[0]?.n ?? 0);

describe('climate sites with published values', () => {
  it('stores typed-in values with their source, and lists them', async () => {
    const { agent } = await signUp(t);
    const res = await agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Published site', sourceKind: 'published', elevationM: 300, publishedValues: published })
      .expect(201);
    assert.equal(res.body.publishedValues.source, published.source);
    assert.equal(res.body.heatingDb99_6, -28.4);
    assert.equal(res.body.computed, null);
    const list = await agent.get('/api/v1/climate-sites').expect(200);
    assert.deepEqual(
      parseBody(climateSiteListSchema, list).map((s) => s.name),
      ['Published site'],
    );
  });

  it('refuses inconsistent values with a field-level message and stores nothing', async () => {
    const { agent } = await signUp(t);
    const res = await agent
      .post('/api/v1/climate-sites')
      .send({
        name: 'Bad',
        sourceKind: 'published',
        publishedValues: { ...published, heating: { db99_6: -10, db99: -20 } },
      })
      .expect(400);
    assert.ok(parseError(res).details?.some((d) => d.path === 'publishedValues.heating.db99_6'));
    const missing = await agent
      .post('/api/v1/climate-sites')
      .send({ name: 'No values', sourceKind: 'published' })
      .expect(400);
    assert.equal(missing.body.error.details[0].path, 'publishedValues');
    assert.equal(await count('climate_sites'), 0);
  });

  it('lets viewers read but not write, and hides other organisations’ sites (404)', async () => {
    const owner = await signUp(t);
    const created = await owner.agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Ours', sourceKind: 'published', publishedValues: published })
      .expect(201);
    const viewer = (await inviteMember(t, owner, 'viewer')).agent;
    await viewer.get(`/api/v1/climate-sites/${created.body.id}`).expect(200);
    await viewer
      .post('/api/v1/climate-sites')
      .send({ name: 'No', sourceKind: 'published', publishedValues: published })
      .expect(403);
    await viewer.delete(`/api/v1/climate-sites/${created.body.id}`).expect(403);

    const outsider = await signUp(t);
    await outsider.agent.get(`/api/v1/climate-sites/${created.body.id}`).expect(404);
    await outsider.agent.patch(`/api/v1/climate-sites/${created.body.id}`).send({ name: 'Taken' }).expect(404);
    await outsider.agent.delete(`/api/v1/climate-sites/${created.body.id}`).expect(404);
    assert.equal((await owner.agent.get(`/api/v1/climate-sites/${created.body.id}`).expect(200)).body.name, 'Ours');
  });
});

describe('hourly records: upload, check, confirm', () => {
  it('parses and checks an upload without storing it, then stores it on confirmation', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const up = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(csv), 'demo.csv')
      .expect(201);
    assert.equal(up.body.format, 'csv');
    assert.equal(up.body.rowCount, threeYears.time.length);
    assert.deepEqual(up.body.quality.yearsFound, [2021, 2022, 2023]);
    assert.ok(up.body.preview.heating.db99_6 <= up.body.preview.heating.db99);
    assert.ok(
      parseBody(climateUploadSchema, up).warnings.some((w) => w.includes('8')),
      'a short record is pointed out',
    );
    assert.equal(await storedHours(), 0, 'nothing stored before confirmation');
    await agent.get(`/api/v1/climate-sites/${siteId}/chart-data`).expect(404);

    const confirmed = await agent.post(`/api/v1/climate-uploads/${up.body.id}/confirm`).expect(200);
    assert.equal(await storedHours(), up.body.quality.distinctHours);
    assert.equal(await count('climate_uploads'), 0);
    assert.deepEqual(
      confirmed.body.computed.conditions,
      up.body.preview,
      'the stored record gives what the preview showed',
    );
    assert.equal(confirmed.body.computed.fileName, 'demo.csv');

    // The same conventions applied to the file directly (values kept to the stored 32-bit precision).
    const parsed = parseWeatherText(csv);
    assert.ok(parsed.ok);
    const f32 = (c: Float64Array) => Float64Array.from(Float32Array.from(c));
    const direct = computeDesignConditions(
      {
        ...parsed.series,
        dryBulbC: f32(parsed.series.dryBulbC),
        dewPointC: f32(parsed.series.dewPointC),
        windSpeedMs: f32(parsed.series.windSpeedMs),
      },
      { elevationM: site.elevationM },
    );
    assert.ok(direct.ok);
    assert.equal(confirmed.body.computed.conditions.heating.db99_6, direct.conditions.heating.db99_6);
    assert.equal(
      confirmed.body.computed.conditions.extremeMin.returnPeriod['50'],
      direct.conditions.extremeMin.returnPeriod['50'],
    );

    const chart = await agent.get(`/api/v1/climate-sites/${siteId}/chart-data`).expect(200);
    assert.equal(chart.body.monthly.length, 12);
    const last = chart.body.distribution.bins.at(-1);
    assert.ok(Math.abs(last.cumulativeFraction - 1) < 1e-9);
    const list = await agent.get('/api/v1/climate-sites').expect(200);
    assert.equal(list.body[0].qualifyingYearCount, 3);

    // Deleting the site takes its hourly record with it.
    await agent.delete(`/api/v1/climate-sites/${siteId}`).expect(204);
    assert.equal(await storedHours(), 0);
    assert.equal(await count('design_conditions'), 0);
  });

  it('accepts several gzipped ISD-Lite yearly files in one upload', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const years = [2021, 2022].map((y) => generateDemoSeries(site, { years: 1, endYear: y }));
    let req = agent.post(`/api/v1/climate-sites/${siteId}/uploads`).field('format', 'auto');
    years.forEach((s, i) => {
      req = req.attach('files', gzipSync(Buffer.from(seriesToIsdLite(s))), `712345-99999-${2021 + i}.gz`);
    });
    const up = await req.expect(201);
    assert.equal(up.body.format, 'isd-lite');
    assert.deepEqual(up.body.quality.yearsFound, [2021, 2022]);
    assert.equal(up.body.fileName, 'ISD-Lite station 712345-99999, 2021–2022 (2 files)');
    assert.deepEqual(up.body.station, { id: '712345-99999', years: [2021, 2022], missingYears: [] });
  });

  it('refuses a bad file whole, naming its lines, and changes nothing', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const good = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(csv), 'demo.csv')
      .expect(201);
    await agent.post(`/api/v1/climate-uploads/${good.body.id}/confirm`).expect(200);
    const before = await storedHours();
    const conditionsBefore = await t.db('design_conditions').first('conditions');

    const lines = csv.split('\n');
    lines[5] = '2021-01-01T04:00Z,warm,-3.0,2.0';
    const bad = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(lines.join('\n')), 'bad.csv')
      .expect(400);
    assert.equal(bad.body.error.code, 'invalid_file');
    assert.equal(bad.body.error.details[0].path, 'line 6');
    assert.equal(await count('climate_uploads'), 0);
    assert.equal(await storedHours(), before);
    assert.deepEqual(await t.db('design_conditions').first('conditions'), conditionsBefore);
  });

  it('refuses what is not text (by content, whatever the name) and what is too large', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]);
    const notText = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', png, 'weather.csv')
      .expect(415);
    assert.equal(notText.body.error.code, 'unsupported_file');
    const huge = Buffer.alloc(60 * 1024 * 1024 + 1, 0x41);
    const tooBig = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', huge, 'huge.csv')
      .expect(413);
    assert.equal(tooBig.body.error.code, 'file_too_large');
    const none = await agent.post(`/api/v1/climate-sites/${siteId}/uploads`).field('format', 'csv').expect(400);
    assert.equal(none.body.error.details[0].path, 'files');
    assert.equal(await count('climate_uploads'), 0);
  });

  it('maps other column names by hand', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const renamed = csv.replace('time,dry_bulb_c,dew_point_c,wind_speed_ms', 'Date/Time,Temp,Dew,Wind');
    await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(renamed), 'x.csv')
      .expect(400);
    const mapped = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .field(
        'mapping',
        JSON.stringify({ time: 'Date/Time', dry_bulb_c: 'Temp', dew_point_c: 'Dew', wind_speed_ms: 'Wind' }),
      )
      .attach('files', Buffer.from(renamed), 'x.csv')
      .expect(201);
    assert.equal(mapped.body.rowCount, threeYears.time.length);
    const badMapping = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .field('mapping', '{"temperature": "Temp"}')
      .attach('files', Buffer.from(renamed), 'x.csv')
      .expect(400);
    assert.equal(badMapping.body.error.code, 'invalid_input');
  });

  it('recomputes the humidity ratio when the elevation changes', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent, 0);
    const up = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(csv), 'demo.csv')
      .expect(201);
    const atSea = await agent.post(`/api/v1/climate-uploads/${up.body.id}/confirm`).expect(200);
    const high = await agent.patch(`/api/v1/climate-sites/${siteId}`).send({ elevationM: 1500 }).expect(200);
    const w0 = atSea.body.computed.conditions.humidification.dp99_6.humidityRatio;
    const w1 = high.body.computed.conditions.humidification.dp99_6.humidityRatio;
    // Same vapour pressure at lower station pressure: W = 0.621945·pw/(p − pw) grows
    // (ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eq. 20; p(1500 m) = 84 556 Pa by Eq. 3).
    assert.ok(w1 > w0 * 1.15 && w1 < w0 * 1.25, `${w0} → ${w1}`);
    assert.equal(high.body.computed.conditions.heating.db99_6, atSea.body.computed.conditions.heating.db99_6);
  });
});
