/**
 * Nothing a user sends can stop the server: logos that only look like images (refused at upload,
 * and harmless when already stored), PDF workers that fail from a callback or never finish, format
 * characters, NUL and lone surrogates in every text field that reaches a PDF, a CSV or an e-mail,
 * row versions past the database's integer range, a malformed Origin, control characters in an
 * upload's file name, and a send that fails half-way.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import { PNG } from 'pngjs';
import { climateSiteSchema } from '../../shared/climate/climate-schemas';
import { projectSchema } from '../../shared/projects/project-schemas';
import { linkCreatedSchema, type ReportView, reportSchema } from '../../shared/reports/report-schemas';
import { scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { createPdfPool } from '../../server/modules/reports/pdf-pool';
import { printable } from '../../server/modules/reports/pdf-worker';
import { bodyBytes, parseBody, parseError } from '../support/parse-body';
import { corruptPng, hugePng, hugeSvg, junkJpeg, realJpeg, realPng } from '../support/hostile-images';
import { BUILDING, fixture, type Fixture } from '../support/scenario-fixture';
import { newAgent, signUp, useTestApp } from '../support/test-app';

const t = useTestApp();

async function pdfText(buffer: Buffer): Promise<string> {
  const { getDocument } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const pdf = await getDocument({ data: new Uint8Array(buffer), isEvalSupported: false }).promise;
  let text = '';
  for (let p = 1; p <= pdf.numPages; p++) {
    const content = await (await pdf.getPage(p)).getTextContent();
    text += content.items.map((i) => ('str' in i ? i.str : '')).join(' ') + '\n';
  }
  return text.replace(/\s+/g, ' ');
}

/** A scenario, a report on it and a public link to it. */
async function sharedReport(
  f: Fixture,
  fields: { scenarioName?: string; optionLabels?: string[]; title?: string; note?: string } = {},
) {
  const scenario = scenarioSchema.parse(
    (
      await f.agent
        .post(`/api/v1/projects/${f.projectId}/scenarios`)
        .send({
          name: fields.scenarioName ?? 'Gas bid',
          settings: { optionLabels: fields.optionLabels ?? ['F 6 kW', 'F 9 kW', 'F 14 kW'] },
        })
        .expect(201)
    ).body,
  );
  const sweep = parseBody(
    sweepAnswerSchema,
    await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).expect(200),
  );
  const report = reportSchema.parse(
    (
      await f.agent
        .post(`/api/v1/projects/${f.projectId}/reports`)
        .send({
          scenarioId: scenario.id,
          title: fields.title ?? 'Your heating options',
          note: fields.note ?? '',
          points: [sweep.rows[0]?.designC],
        })
        .expect(201)
    ).body,
  );
  const { url } = parseBody(
    linkCreatedSchema,
    await f.agent
      .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`)
      .send({ expiresInDays: 10 })
      .expect(201),
  );
  return { scenario, report, token: url.split('/r/')[1] ?? '' };
}

const storedLogo = (organizationId: string, contentType: string, content: Buffer) =>
  t
    .db('organization_logos')
    .insert({ organization_id: organizationId, content_type: contentType, content })
    .onConflict('organization_id')
    .merge();

describe('logos that only look like images', () => {
  const hostile = [
    {
      name: 'a PNG with a corrupt zlib stream',
      file: 'logo.png',
      content: corruptPng(),
      reason: /PNG could not be decoded/,
    },
    {
      name: 'a PNG that declares 100 000 pixels a side',
      file: 'logo.png',
      content: hugePng(),
      reason: /at most 4000 a side/,
    },
    {
      name: 'a JPEG header followed by HTML',
      file: 'logo.jpg',
      content: junkJpeg(),
      reason: /JPEG could not be decoded/,
    },
    { name: 'an SVG sized 1e308', file: 'logo.svg', content: hugeSvg(), reason: /out of range/ },
  ];

  it('refuses each at upload with a field-level 400, and keeps the logo there was', async () => {
    const f = await fixture(t, false);
    await f.agent.put('/api/v1/organization/logo').attach('logo', realPng(), 'firm.png').expect(200);
    const before = (await t.db('organization_logos').first<{ content: Buffer }>('content')).content;
    for (const h of hostile) {
      const res = await f.agent.put('/api/v1/organization/logo').attach('logo', h.content, h.file);
      assert.equal(res.status, 400, h.name);
      assert.equal(parseError(res).code, 'invalid_file', h.name);
      assert.equal(parseError(res).details?.[0]?.path, 'logo', h.name);
      assert.match(parseError(res).details?.[0]?.message ?? '', h.reason, h.name);
    }
    const after = (await t.db('organization_logos').first<{ content: Buffer }>('content')).content;
    assert.ok(after.equals(before), 'the earlier logo is kept');
  });

  it('keeps a real PNG re-encoded without its extra chunks, and a real JPEG as sent', async () => {
    const f = await fixture(t, false);
    const png = realPng();
    assert.ok(png.includes(Buffer.from('invented firm logo')));
    await f.agent.put('/api/v1/organization/logo').attach('logo', png, 'firm.png').expect(200);
    const stored = (await t.db('organization_logos').first<{ content: Buffer }>('content')).content;
    assert.ok(!stored.includes(Buffer.from('invented firm logo')), 'the text chunk is gone');
    const decoded = PNG.sync.read(stored);
    assert.deepEqual([decoded.width, decoded.height], [24, 12]);
    assert.deepEqual([...decoded.data.subarray(4, 8)], [7, 80, 95, 255], 'the second pixel survives re-encoding');
    const jpg = realJpeg();
    await f.agent.put('/api/v1/organization/logo').attach('logo', jpg, 'firm.jpg').expect(200);
    const storedJpeg = await t
      .db('organization_logos')
      .first<{ content: Buffer; content_type: string }>('content', 'content_type');
    assert.equal(storedJpeg.content_type, 'image/jpeg');
    assert.ok(storedJpeg.content.equals(jpg));
  });

  it('cannot stop the server once stored: the PDF answers 422 naming the logo, and the server goes on', async () => {
    const f = await fixture(t);
    const { report, token } = await sharedReport(f);
    for (const [type, content] of [
      ['image/png', corruptPng()],
      ['image/jpeg', junkJpeg()],
      ['image/svg+xml', hugeSvg()],
    ] as const) {
      await storedLogo(f.organizationId, type, content);
      const pub = await request(t.app).get(`/api/v1/public/reports/${token}/pdf`);
      assert.equal(pub.status, 422, type);
      assert.equal(parseError(pub).code, 'logo_unreadable', type);
      assert.match(parseError(pub).message, /logo could not be read.*upload the logo again/, type);
      const preview = await f.agent.get(`/api/v1/projects/${f.projectId}/reports/${report.id}/pdf`);
      assert.equal(preview.status, 422, type);
      await request(t.app).get('/api/health').expect(200);
    }
    // With the logo removed the same report prints again.
    await f.agent.delete('/api/v1/organization/logo').expect(204);
    const ok = await request(t.app).get(`/api/v1/public/reports/${token}/pdf`).expect(200);
    assert.match(await pdfText(bodyBytes(ok)), /Your heating options/);
  });
});

describe('the PDF pool', () => {
  const view = (title: string) => ({ title }) as ReportView;
  const logo = { contentType: 'image/png', content: Buffer.from('any') };

  it('answers a worker that throws from a callback with a clear 500, and the next render gets a new worker', async () => {
    const pool = createPdfPool({
      filename: new URL('../support/faulty-pdf-worker.ts', import.meta.url).href,
      maxThreads: 1,
    });
    try {
      await assert.rejects(
        pool.render(view('throw from a callback'), null),
        (err: { status: number; code: string; message: string }) => {
          assert.equal(err.status, 500);
          assert.equal(err.code, 'pdf_failed');
          assert.match(err.message, /PDF could not be made \(the PDF writer failed\)/);
          return true;
        },
      );
      const next = await pool.render(view('plain'), null);
      assert.match(next.toString('latin1'), /^%PDF-1\.7 plain/);
    } finally {
      await pool.close();
    }
  });

  it('tells a logo the PDF writer cannot print (422) from other failures', async () => {
    const pool = createPdfPool({
      filename: new URL('../support/faulty-pdf-worker.ts', import.meta.url).href,
      maxThreads: 1,
    });
    try {
      await assert.rejects(
        pool.render(view('fail on the logo'), logo),
        (err: { status: number; code: string; details: { path: string }[] }) => {
          assert.equal(err.status, 422);
          assert.equal(err.code, 'logo_unreadable');
          assert.equal(err.details[0]?.path, 'logo');
          return true;
        },
      );
      await assert.rejects(pool.render(view('throw from a callback'), logo), { status: 500, code: 'pdf_failed' });
    } finally {
      await pool.close();
    }
  });

  it('stops a render that takes too long, and goes on', async () => {
    const pool = createPdfPool({
      filename: new URL('../support/faulty-pdf-worker.ts', import.meta.url).href,
      maxThreads: 1,
      timeoutMs: 8000,
    });
    try {
      await assert.rejects(pool.render(view('take forever'), null), (err: { status: number; message: string }) => {
        assert.equal(err.status, 500);
        assert.match(err.message, /took longer than 8 s/);
        return true;
      });
      assert.match((await pool.render(view('plain'), null)).toString('latin1'), /plain/);
    } finally {
      await pool.close();
    }
  });
});

const ZW = '\u200b';
const BOM = '\ufeff';

describe('characters a font has no glyph for', () => {
  it('drops format characters from printed text, keeps line breaks, prints a thin space as a space and a lone surrogate as ?', () => {
    assert.equal(printable(`Zero${ZW}width${BOM} and\u200dmarks\u202e`), 'Zerowidth andmarks');
    assert.equal(printable('two\nlines\tand tab\u0007'), 'two\nlines\tand tab');
    assert.equal(printable('half \ud83d here, whole \ud83d\ude00'), 'half ? here, whole \ud83d\ude00');
    assert.equal(printable('21\u2009°C'), '21 °C');
  });

  it('prints, exports and e-mails U+200B and U+FEFF in every text field that reaches them', async () => {
    const owner = await signUp(t, {
      name: `Pat${ZW}ri${BOM}ce Installer`,
      organizationName: `North${ZW}wind${BOM} Heating (invented)`,
    });
    const f = await fixture(t);
    // The fixture's own organisation is used for the scenario; rename the project and its fields there.
    const project = parseBody(projectSchema, await f.agent.get(`/api/v1/projects/${f.projectId}`).expect(200));
    await f.agent
      .patch(`/api/v1/projects/${f.projectId}`)
      .send({
        version: project.version,
        name: `Lake${ZW}side${BOM} house`,
        clientName: `Ro${ZW}bin${BOM} Client`,
        siteAddress: `12 Ex${ZW}ample${BOM} Lane`,
      })
      .expect(200);
    const { scenario, report, token } = await sharedReport(f, {
      scenarioName: `Gas${ZW}bid${BOM}`,
      title: `Heating${ZW} options${BOM} for you`,
      note: `Call${ZW} me${BOM} with\u2009questions.`,
    });
    const pdf = await request(t.app).get(`/api/v1/public/reports/${token}/pdf`).expect(200);
    const text = await pdfText(bodyBytes(pdf));
    // The project's name is not printed (the report has its own title); the client and the address are.
    for (const expected of ['Heating options for you', 'Robin Client', '12 Example Lane', 'Call me with questions.']) {
      assert.ok(text.includes(expected), `the PDF shows “${expected}”`);
    }
    assert.ok(!text.includes(ZW) && !text.includes(BOM));

    const csv = await f.agent.get(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep.csv`).expect(200);
    assert.ok(csv.text.includes(`Gas${ZW}bid`), 'the CSV keeps the characters as typed');

    const mail = t.sink.waitFor((m) => m.to.includes('client@example.test'));
    await f.agent
      .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/send`)
      .send({ to: 'client@example.test', message: `Here${ZW} it is${BOM}.` })
      .expect(201);
    assert.ok((await mail).text.includes(`Here${ZW} it is`));

    // An organisation and a person named with them print too.
    await owner.agent
      .post('/api/v1/projects')
      .send({ name: `Second${ZW} house` })
      .expect(201);
    await request(t.app).get('/api/health').expect(200);
  });
});

describe('NUL and lone surrogates', () => {
  const BAD = [
    { name: 'NUL', text: 'Bad\u0000text' },
    { name: 'a lone high surrogate', text: 'Bad \ud800 text' },
    { name: 'a lone low surrogate', text: 'Bad \udfff text' },
  ];

  it('are refused with the field named in every text field that reaches a PDF, a CSV or an e-mail, and nothing is stored', async () => {
    const f = await fixture(t);
    const { scenario, report } = await sharedReport(f);
    const project = parseBody(projectSchema, await f.agent.get(`/api/v1/projects/${f.projectId}`).expect(200));
    const fresh = scenarioSchema.parse(
      (await f.agent.get(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}`).expect(200)).body,
    );
    const cases: {
      method: 'post' | 'patch' | 'put';
      url: string;
      body: (s: string) => Record<string, unknown>;
      path: string;
      agent?: request.Agent;
    }[] = [
      {
        method: 'post',
        url: '/api/v1/auth/sign-up',
        body: (s) => ({ email: 'someone@example.test', name: 'A person', organizationName: s }),
        path: 'organizationName',
        agent: newAgent(t.app),
      },
      {
        method: 'post',
        url: '/api/v1/auth/sign-up',
        body: (s) => ({ email: 'someone@example.test', name: s }),
        path: 'name',
        agent: newAgent(t.app),
      },
      { method: 'patch', url: '/api/v1/me', body: (s) => ({ name: s }), path: 'name' },
      { method: 'post', url: '/api/v1/organizations', body: (s) => ({ name: s }), path: 'name' },
      { method: 'post', url: '/api/v1/projects', body: (s) => ({ name: s }), path: 'name' },
      {
        method: 'patch',
        url: `/api/v1/projects/${f.projectId}`,
        body: (s) => ({ version: project.version, clientName: s }),
        path: 'clientName',
      },
      {
        method: 'patch',
        url: `/api/v1/projects/${f.projectId}`,
        body: (s) => ({ version: project.version, siteAddress: s }),
        path: 'siteAddress',
      },
      {
        method: 'patch',
        url: `/api/v1/projects/${f.projectId}`,
        body: (s) => ({ version: project.version, notes: s }),
        path: 'notes',
      },
      {
        method: 'patch',
        url: `/api/v1/projects/${f.projectId}/scenarios/${scenario.id}`,
        body: (s) => ({ version: fresh.version, name: s }),
        path: 'name',
      },
      {
        method: 'patch',
        url: `/api/v1/projects/${f.projectId}/scenarios/${scenario.id}`,
        body: (s) => ({ version: fresh.version, settings: { optionLabels: ['F 6 kW', s] } }),
        path: 'settings.optionLabels.1',
      },
      {
        method: 'patch',
        url: `/api/v1/equipment-lists/${f.listId}`,
        body: (s) => ({ version: 2, name: s }),
        path: 'name',
      },
      {
        method: 'put',
        url: `/api/v1/equipment-lists/${f.listId}/options`,
        body: (s) => ({
          version: 2,
          options: [
            {
              kind: 'furnace',
              label: s,
              fuel: 'gas',
              efficiency: 0.95,
              outputW: 6000,
              installedPrice: '3000.00',
              lifeYears: 20,
            },
          ],
        }),
        path: 'options.0.label',
      },
      {
        method: 'post',
        url: `/api/v1/projects/${f.projectId}/reports`,
        body: (s) => ({ scenarioId: scenario.id, title: s, points: report.points }),
        path: 'title',
      },
      {
        method: 'post',
        url: `/api/v1/projects/${f.projectId}/reports`,
        body: (s) => ({ scenarioId: scenario.id, title: 'T', note: s, points: report.points }),
        path: 'note',
      },
      {
        method: 'post',
        url: `/api/v1/projects/${f.projectId}/reports/${report.id}/send`,
        body: (s) => ({ to: 'client@example.test', message: s }),
        path: 'message',
      },
      { method: 'post', url: '/api/v1/climate-sites', body: (s) => ({ name: s, sourceKind: 'hourly' }), path: 'name' },
    ];
    const counts = async () =>
      Promise.all(
        [
          'projects',
          'scenarios',
          'reports',
          'report_links',
          'report_sends',
          'organizations',
          'climate_sites',
          'sign_up_requests',
        ].map(async (table) => (await t.db(table).count<{ n: string }[]>('* as n'))[0]?.n),
      );
    const before = await counts();
    t.sink.clear();
    for (const c of cases) {
      for (const bad of BAD) {
        const res = await (c.agent ?? f.agent)[c.method](c.url).send(c.body(bad.text));
        const label = `${c.method.toUpperCase()} ${c.url} ${c.path} with ${bad.name}`;
        assert.equal(res.status, 400, label);
        assert.equal(parseError(res).code, 'invalid_input', label);
        assert.deepEqual(
          parseError(res).details?.map((d) => d.path),
          [c.path],
          label,
        );
      }
    }
    // A query string is checked the same way.
    const q = await f.agent.get('/api/v1/projects').query({ archived: 'true\u0000' });
    assert.equal(q.status, 400);
    assert.deepEqual(await counts(), before, 'nothing was stored');
    assert.equal(t.sink.messages().length, 0, 'no e-mail left');
    const names = await t.db('projects').pluck('name');
    assert.ok(names.every((n: string) => !n.includes('\u0000')));
  });
});

describe('numbers, headers and file names', () => {
  it('refuses version 2^31 on every change that carries a version with 400 naming the version', async () => {
    const f = await fixture(t);
    const { scenario } = await sharedReport(f);
    const changes: { method: 'patch' | 'put'; url: string; body: Record<string, unknown> }[] = [
      { method: 'patch', url: `/api/v1/projects/${f.projectId}`, body: { name: 'Renamed' } },
      { method: 'put', url: `/api/v1/projects/${f.projectId}/building`, body: { building: BUILDING } },
      { method: 'patch', url: `/api/v1/projects/${f.projectId}/scenarios/${scenario.id}`, body: { name: 'Renamed' } },
      { method: 'patch', url: `/api/v1/equipment-lists/${f.listId}`, body: { name: 'Renamed' } },
      { method: 'put', url: `/api/v1/equipment-lists/${f.listId}/options`, body: { options: [] } },
      {
        method: 'put',
        url: '/api/v1/energy-prices',
        body: { prices: { currency: 'USD', electricityPerKwh: '0.1600' } },
      },
    ];
    for (const c of changes) {
      for (const version of [2 ** 31, 2 ** 53 + 10]) {
        const res = await f.agent[c.method](c.url).send({ ...c.body, version });
        assert.equal(res.status, 400, `${c.method} ${c.url} ${version}`);
        assert.deepEqual(
          [...new Set(parseError(res).details?.map((d) => d.path))],
          ['version'],
          `${c.method} ${c.url}`,
        );
      }
      // The largest version the database holds is a plain stale update, not a failure.
      const stale = await f.agent[c.method](c.url).send({ ...c.body, version: 2 ** 31 - 1 });
      assert.equal(stale.status, 409, `${c.method} ${c.url} at 2^31 - 1`);
    }
    await request(t.app).get('/api/health').expect(200);
  });

  it('refuses a malformed Origin with 403', async () => {
    for (const origin of ['http://[bad', '::::', 'http://exa mple.test', '\u00ff\u00fe']) {
      const res = await request(t.app)
        .post('/api/v1/auth/sign-in')
        .set('Origin', origin)
        .send({ email: 'a@example.test', password: 'whatever it is' });
      assert.equal(res.status, 403, origin);
      assert.equal(parseError(res).code, 'csrf');
    }
  });

  it('answers 400 for an upload whose file name holds control characters, and keeps the logo there was', async () => {
    const f = await fixture(t, false);
    await f.agent.put('/api/v1/organization/logo').attach('logo', realPng(), 'firm.png').expect(200);
    for (const name of ['fi\u0001rm\u0007\u001f.png', 'no\u0000te.png']) {
      const res = await f.agent.put('/api/v1/organization/logo').attach('logo', realJpeg(), name);
      assert.equal(res.status, 400, JSON.stringify(name));
      assert.equal(parseError(res).code, 'invalid_upload');
    }
    const site = await f.agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Control characters', sourceKind: 'hourly' })
      .expect(201);
    const upload = await f.agent
      .post(`/api/v1/climate-sites/${parseBody(climateSiteSchema, site).id}/uploads`)
      .attach('files', Buffer.from('time,temp\n'), 'we\u0002ather.csv');
    assert.equal(upload.status, 400);
    assert.equal(
      (await t.db('organization_logos').first<{ content_type: string }>('content_type')).content_type,
      'image/png',
    );
    await request(t.app).get('/api/health').expect(200);
  });
});

describe('report sends', () => {
  it('write the link and the send together: a failure before the e-mail leaves nothing and sends nothing, and the retry sends once', async () => {
    const f = await fixture(t);
    const { report } = await sharedReport(f);
    const count = async (table: string) => Number((await t.db(table).count<{ n: string }[]>('* as n'))[0]?.n);
    const linksBefore = await count('report_links');
    t.sink.clear();
    // The database refuses the send's record, as it would when a constraint or the disk fails.
    await t.db.raw(
      `CREATE FUNCTION refuse_report_send() RETURNS trigger AS $$ BEGIN RAISE EXCEPTION 'no space left'; END $$ LANGUAGE plpgsql`,
    );
    await t.db.raw(
      'CREATE TRIGGER refuse_report_send BEFORE INSERT ON report_sends FOR EACH ROW EXECUTE FUNCTION refuse_report_send()',
    );
    try {
      const res = await f.agent
        .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/send`)
        .send({ to: 'client@example.test', message: 'Hello' });
      assert.equal(res.status, 500);
    } finally {
      await t.db.raw('DROP TRIGGER refuse_report_send ON report_sends');
      await t.db.raw('DROP FUNCTION refuse_report_send()');
    }
    assert.equal(await count('report_links'), linksBefore, 'no link left behind');
    assert.equal(await count('report_sends'), 0);
    await new Promise((r) => setTimeout(r, 200));
    assert.equal(t.sink.messages().length, 0, 'nothing was e-mailed');

    const mail = t.sink.waitFor((m) => m.to.includes('client@example.test'));
    await f.agent
      .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/send`)
      .send({ to: 'client@example.test', message: 'Hello' })
      .expect(201);
    await mail;
    assert.equal(t.sink.messages().length, 1, 'one e-mail');
    assert.deepEqual(await t.db('report_sends').select('status', 'error'), [{ status: 'sent', error: null }]);
    assert.equal(await count('report_links'), linksBefore + 1, 'one link for the one send');
  });
});
