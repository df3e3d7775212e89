/**
 * The climate basis through the API: an hourly record estimated for a published-values site from a
 * reference site's record (with its provenance, its refusals and its recomputation), the recent-years
 * design values and trend of a site, and a scenario swept over the latest N years only.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { gzipSync } from 'node:zlib';
import { climateSiteSchema, climateUploadSchema, recentYearsSchema } from '../../shared/climate/climate-schemas';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { DEMO_SITES, generateDemoSeries, seriesToIsdLite } from '../../shared/climate/demo-weather';
import { scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { insertSite } from '../../server/modules/climate/climate-repo';
import { storeRecord } from '../../server/modules/climate/climate-service';
import { atStoragePrecision } from '../../server/modules/climate/series-codec';
import { parseError } from '../support/parse-body';
import { fixture, type Fixture } from '../support/scenario-fixture';
import { useTestApp } from '../support/test-app';
import { assertClose } from '../engine/close-to';

const t = useTestApp();

/** The conditions of a series cut to the years from `fromYear` on, by a plain date comparison. */
function conditionsFrom(series: typeof twelveYears, fromYear: number) {
  const from = Date.UTC(fromYear, 0, 1);
  const keep = [...series.time.keys()].filter((i) => (series.time[i] ?? 0) >= from);
  const pick = (c: Float64Array) => Float64Array.from(keep, (i) => c[i] ?? NaN);
  const result = computeDesignConditions({
    time: pick(series.time),
    dryBulbC: pick(series.dryBulbC),
    dewPointC: pick(series.dewPointC),
    windSpeedMs: pick(series.windSpeedMs),
    stationPressureKpa: pick(series.stationPressureKpa),
  });
  if (!result.ok) throw new Error('no conditions');
  return result.conditions;
}
const demo = DEMO_SITES[0];
if (!demo) throw new Error('no demo site');
const twelveYears = atStoragePrecision(generateDemoSeries(demo, { years: 12, endYear: 2024 }));
const twelve = computeDesignConditions(twelveYears);
if (!twelve.ok) throw new Error('demo record without conditions');

/** A fixture plus a 12-year reference site and a published site with degree-days (all invented). */
async function withReference(f: Fixture) {
  const organizationId = f.organizationId;
  const referenceId = await insertSite(t.db, organizationId, null, {
    name: 'Reference airport (invented)',
    sourceKind: 'hourly',
    elevationM: demo?.elevationM ?? null,
  });
  await t.db.transaction((trx) =>
    storeRecord(trx, referenceId, twelveYears, null, { fileName: 'gen', rowCount: twelveYears.time.length }),
  );
  const ok = twelve.ok ? twelve.conditions : null;
  if (!ok) throw new Error('unreachable');
  const published = {
    source: 'Invented table',
    heating: { db99_6: Math.round(ok.heating.db99_6 + 2), db99: Math.round(ok.heating.db99 + 2) },
    hdd18: Math.round(ok.hdd18 * 0.94),
  };
  const res = await f.agent
    .post('/api/v1/climate-sites')
    .send({ name: 'Hollin Ford (invented)', sourceKind: 'published', publishedValues: published })
    .expect(201);
  return { referenceId, targetId: climateSiteSchema.parse(res.body).id, published };
}

describe('an hourly record estimated from published values', () => {
  it('stores the estimate with its provenance; the table’s values stay; the record matches the 99.6 % value and degree-days', async () => {
    const f = await fixture(t);
    const { referenceId, targetId, published } = await withReference(f);
    const res = await f.agent
      .post(`/api/v1/climate-sites/${targetId}/estimate`)
      .send({ referenceSiteId: referenceId })
      .expect(200);
    const site = climateSiteSchema.parse(res.body);
    assert.ok(site.estimate && site.computed);
    assert.equal(site.estimate.referenceSiteId, referenceId);
    assert.equal(
      site.estimate.label,
      "Hour-by-hour figures estimated from Reference airport (invented)'s record, adjusted to Hollin Ford (invented)'s published values.",
    );
    assert.ok(Math.abs(site.estimate.stretch) <= 0.5 && site.estimate.stretch !== 0);
    assert.equal(site.heatingDb99_6, published.heating.db99_6);
    assert.equal(site.heatingDb99, published.heating.db99);
    // Stored at float4 precision: the recomputed values agree to well under 0.01 K and 0.1 °C·day.
    assertClose(site.computed.conditions.heating.db99_6, published.heating.db99_6, 0.01, 'estimated 99.6 %');
    assertClose(site.computed.conditions.hdd18, published.hdd18, 0.1, 'estimated degree-days');
  });

  it('refuses a short reference with a field-level 422 and stores nothing; refuses bad input with 400', async () => {
    const f = await fixture(t); // its hourly site has 4 years
    const { targetId } = await withReference(f);
    const refused = await f.agent
      .post(`/api/v1/climate-sites/${targetId}/estimate`)
      .send({ referenceSiteId: f.siteId })
      .expect(422);
    const error = parseError(refused);
    assert.equal(error.code, 'estimate_refused');
    assert.equal(error.details?.[0]?.path, 'referenceSiteId');
    assert.match(error.details?.[0]?.message ?? '', /only 4 qualifying year/);
    const after = climateSiteSchema.parse((await f.agent.get(`/api/v1/climate-sites/${targetId}`).expect(200)).body);
    assert.equal(after.computed, null);
    assert.equal(after.estimate, null);
    const bad = await f.agent
      .post(`/api/v1/climate-sites/${targetId}/estimate`)
      .send({ referenceSiteId: 'nope' })
      .expect(400);
    assert.equal(parseError(bad).details?.[0]?.path, 'referenceSiteId');
    await f.agent.post(`/api/v1/climate-sites/${targetId}/estimate`).send({ referenceSiteId: targetId }).expect(422);
  });

  it('is estimated again when the published values change', async () => {
    const f = await fixture(t);
    const { referenceId, targetId, published } = await withReference(f);
    await f.agent.post(`/api/v1/climate-sites/${targetId}/estimate`).send({ referenceSiteId: referenceId }).expect(200);
    const changed = {
      ...published,
      heating: { db99_6: published.heating.db99_6 - 1, db99: published.heating.db99 - 1 },
    };
    const res = await f.agent.patch(`/api/v1/climate-sites/${targetId}`).send({ publishedValues: changed }).expect(200);
    const site = climateSiteSchema.parse(res.body);
    assert.equal(site.estimate?.matched.db99_6, changed.heating.db99_6);
    assertClose(site.computed?.conditions.heating.db99_6, changed.heating.db99_6, 0.01, 'new 99.6 %');
  });

  it('gives a scenario at the estimated site the hour-based figures, with the estimate sentence in the answer, the CSV and the report', async () => {
    const f = await fixture(t);
    const { referenceId, targetId } = await withReference(f);
    await f.agent.post(`/api/v1/climate-sites/${targetId}/estimate`).send({ referenceSiteId: referenceId }).expect(200);
    const scenario = scenarioSchema.parse(
      (
        await f.agent
          .post(`/api/v1/projects/${f.projectId}/scenarios`)
          .send({ name: 'Estimated', climateSiteId: targetId })
          .expect(201)
      ).body,
    );
    const sweep = sweepAnswerSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).send({}).expect(200)).body,
    );
    assert.equal(sweep.hasRecord, true);
    assert.equal(sweep.years.length, 12);
    assert.ok(sweep.rows.some((r) => r.unmetHoursPerYear !== null && r.worstSagC !== null));
    assert.match(sweep.climateBasis?.estimateLabel ?? '', /^Hour-by-hour figures estimated from Reference airport/);
    const csv = await f.agent.get(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep.csv`).expect(200);
    assert.match(csv.text, /estimated from Reference airport \(invented\)'s record/);
  });
});

describe('recent years of a record', () => {
  it('shows the whole record and the latest 10 years side by side, with the trend of the coldest hour', async () => {
    const f = await fixture(t);
    const { referenceId } = await withReference(f);
    const res = await f.agent.get(`/api/v1/climate-sites/${referenceId}/recent-years`).expect(200);
    const answer = recentYearsSchema.parse(res.body);
    assert.deepEqual(
      answer.windows.map((w) => [w.latestYears, w.firstYear, w.lastYear, w.qualifyingYearCount]),
      [
        [null, 2013, 2024, 12],
        [10, 2015, 2024, 10],
      ],
    );
    // The latest-10 values, recomputed here from the same stored series trimmed by date.
    assertClose(
      answer.windows[1]?.heating.db99_6,
      conditionsFrom(twelveYears, 2015).heating.db99_6,
      1e-9,
      'latest 10: 99.6 %',
    );
    assert.equal(answer.trend.annual.length, 12);
    assert.equal(answer.trend.enough, true);
    assert.match(answer.trend.sentence, /^Over 2013–2024 the coldest hour of the year has/);
    await f.agent.get(`/api/v1/climate-sites/${f.publishedSiteId}/recent-years`).expect(404);
  });

  it('sweeps a scenario over the latest 8 years only, and refuses fewer than 8', async () => {
    const f = await fixture(t);
    const { referenceId } = await withReference(f);
    const whole = scenarioSchema.parse(
      (
        await f.agent
          .post(`/api/v1/projects/${f.projectId}/scenarios`)
          .send({ name: 'Whole', climateSiteId: referenceId })
          .expect(201)
      ).body,
    );
    const recent = scenarioSchema.parse(
      (
        await f.agent
          .post(`/api/v1/projects/${f.projectId}/scenarios`)
          .send({ name: 'Recent', climateSiteId: referenceId, settings: { climateBasisYears: 8 } })
          .expect(201)
      ).body,
    );
    const a = sweepAnswerSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${whole.id}/sweep`).send({}).expect(200)).body,
    );
    const b = sweepAnswerSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${recent.id}/sweep`).send({}).expect(200)).body,
    );
    assert.equal(a.years.length, 12);
    assert.deepEqual(b.years, [2017, 2018, 2019, 2020, 2021, 2022, 2023, 2024]);
    assert.equal(a.climateBasis?.description, 'Whole record (2013–2024, 12 years)');
    assert.equal(b.climateBasis?.description, 'Latest 8 years of the record (2017–2024)');
    // The 99.6 % rung of the recent basis is the latest 8 years' own value.
    const r996 = b.rows.find((r) => r.label === '99.6 %');
    assertClose(r996?.designC, conditionsFrom(twelveYears, 2017).heating.db99_6, 1e-9, 'recent 99.6 % rung');
    const refused = await f.agent
      .post(`/api/v1/projects/${f.projectId}/scenarios`)
      .send({ name: 'Too few', settings: { climateBasisYears: 5 } })
      .expect(400);
    assert.equal(parseError(refused).details?.[0]?.path, 'settings.climateBasisYears');
  });
});

describe('yearly ISD-Lite files in bulk', () => {
  it('reads the station and years from the file names, names the record after the station and reports the missing year', async () => {
    const f = await fixture(t);
    const site = await f.agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Station upload (invented)', sourceKind: 'hourly' })
      .expect(201);
    const siteId = climateSiteSchema.parse(site.body).id;
    let request = f.agent.post(`/api/v1/climate-sites/${siteId}/uploads`);
    for (const year of [2020, 2021, 2023]) {
      const one = generateDemoSeries(demo ?? DEMO_SITES[0]!, { years: 1, endYear: year });
      request = request.attach('files', gzipSync(Buffer.from(seriesToIsdLite(one))), `725090-14739-${year}.gz`);
    }
    const res = await request.expect(201);
    const upload = climateUploadSchema.parse(res.body);
    assert.equal(upload.format, 'isd-lite');
    assert.deepEqual(upload.station, { id: '725090-14739', years: [2020, 2021, 2023], missingYears: [2022] });
    assert.equal(upload.fileName, 'ISD-Lite station 725090-14739, 2020–2023 (3 files)');
    assert.match(upload.warnings[0] ?? '', /^No file for 2022 of ISD-Lite station 725090-14739/);
    const stored = climateSiteSchema.parse(
      (await f.agent.post(`/api/v1/climate-uploads/${upload.id}/confirm`).send().expect(200)).body,
    );
    assert.equal(stored.computed?.fileName, 'ISD-Lite station 725090-14739, 2020–2023 (3 files)');
    assert.deepEqual(stored.computed?.conditions.period.qualifyingYears, [2020, 2021, 2023]);
  });

  it('leaves other names alone', async () => {
    const f = await fixture(t);
    const site = await f.agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Plain upload (invented)', sourceKind: 'hourly' })
      .expect(201);
    const one = generateDemoSeries(demo ?? DEMO_SITES[0]!, { years: 1, endYear: 2021 });
    const res = await f.agent
      .post(`/api/v1/climate-sites/${climateSiteSchema.parse(site.body).id}/uploads`)
      .attach('files', Buffer.from(seriesToIsdLite(one)), 'station.txt')
      .expect(201);
    assert.equal(climateUploadSchema.parse(res.body).station, null);
    assert.equal(climateUploadSchema.parse(res.body).fileName, 'station.txt');
  });
});
