/**
 * Client reports through the API: composing, links (signed token stored as a hash, expiry,
 * revocation → 410 with nothing of the report), the public view without a session, e-mail through
 * the SMTP sink with failures recorded, the PDF read back as text, the logo's content checks.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import {
  linkCreatedSchema,
  type Report,
  reportSchema,
  reportViewSchema,
  sendFailedSchema,
} from '../../shared/reports/report-schemas';
import { type Scenario, scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { newReportToken, verifyReportToken, hashReportToken } from '../../server/modules/reports/report-tokens';
import { sanitizeSvg, sniffImage } from '../../server/modules/orgs/logo-service';
import { bodyBytes, parseBody, parseError } from '../support/parse-body';
import { fixture, type Fixture } from '../support/scenario-fixture';
import { createTestApp, inviteMember, newAgent, PASSWORD, signUp, useTestApp } from '../support/test-app';

const t = useTestApp();

async function pdfText(buffer: Buffer): Promise<string> {
  const { getDocument } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const pdf = await getDocument({ data: new Uint8Array(buffer), isEvalSupported: false }).promise;
  let text = '';
  for (let p = 1; p <= pdf.numPages; p++) {
    const page = await pdf.getPage(p);
    const content = await page.getTextContent();
    text += content.items.map((i) => ('str' in i ? i.str : '')).join(' ') + '\n';
  }
  return text;
}

async function reportOf(
  f: Fixture,
  body: Record<string, unknown> = {},
): Promise<{ scenario: Scenario; report: Report }> {
  const scenario = scenarioSchema.parse(
    (
      await f.agent
        .post(`/api/v1/projects/${f.projectId}/scenarios`)
        .send({ name: 'Gas bid', settings: { optionLabels: ['F 6 kW', 'F 9 kW', 'F 14 kW'] } })
        .expect(201)
    ).body,
  );
  const sweep = parseBody(
    sweepAnswerSchema,
    await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).expect(200),
  );
  const at = (label: string) => sweep.rows.find((r) => r.label === label)?.designC ?? 0;
  const res = await f.agent
    .post(`/api/v1/projects/${f.projectId}/reports`)
    .send({
      scenarioId: scenario.id,
      title: 'Your heating options',
      note: 'Call me with questions.',
      points: [at('99 %'), at('50-year')],
      ...body,
    })
    .expect(201);
  return { scenario, report: reportSchema.parse(res.body) };
}

const tokenOf = (url: string) => url.split('/r/')[1] ?? '';

describe('report tokens', () => {
  it('verify only with the right key and an untouched tag; the stored hash is not the token', () => {
    const { token, hash } = newReportToken('a-secret-that-is-long-enough-000000');
    assert.ok(verifyReportToken('a-secret-that-is-long-enough-000000', token));
    assert.equal(verifyReportToken('another-secret-long-enough-00000000', token), false);
    const [random, tag] = token.split('.');
    const flipped = `${random}.${(tag?.[0] === 'A' ? 'B' : 'A') + (tag ?? '').slice(1)}`;
    assert.equal(verifyReportToken('a-secret-that-is-long-enough-000000', flipped), false);
    assert.equal(verifyReportToken('a-secret-that-is-long-enough-000000', '../../etc/passwd'), false);
    assert.notEqual(hash, token);
    assert.equal(hash, hashReportToken(token));
    assert.match(hash, /^[0-9a-f]{64}$/);
  });
});

describe('reports API', () => {
  it('composes a report, shares it by link with no account, and the public view shows the chosen points', async () => {
    const f = await fixture(t);
    const { report } = await reportOf(f);
    assert.equal(report.points.length, 2);
    assert.equal(report.links.length, 0);
    const made = await f.agent
      .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`)
      .send({ expiresInDays: 10 })
      .expect(201);
    const { url } = parseBody(linkCreatedSchema, made);
    assert.match(url, /^http:\/\/tailroom\.test\/r\/[\w-]{43}\.[\w-]{22}$/);
    const stored = await t.db('report_links').select('token_hash');
    assert.deepEqual(
      stored.map((r: { token_hash: string }) => r.token_hash),
      [hashReportToken(tokenOf(url))],
    );

    const view = reportViewSchema.parse(
      (
        await request(t.app)
          .get(`/api/v1/public/reports/${tokenOf(url)}`)
          .expect(200)
      ).body,
    );
    assert.equal(view.title, 'Your heating options');
    assert.equal(view.note, 'Call me with questions.');
    assert.deepEqual(
      view.options.map((o) => o.tag),
      ['99 %', '50-yr'],
    );
    assert.ok(view.options.every((o) => o.figures.length === 7));
    assert.match(view.options[0]?.heading ?? '', /^Option A: sized for a typical cold winter night \(−?\d+ °C\)$/);
    assert.match(view.options[0]?.sentence ?? '', /typical winter|keeps the house at the temperature you set/);
    assert.ok(view.climate.some((c) => c.includes('about 88 hours')));
    // Each option's odds in one paragraph led by its letter, in whole degrees, over the years the costs are compared.
    assert.deepEqual(
      view.options.map((o) => o.odds.length),
      [1, 1],
    );
    assert.match(
      view.options[0]?.odds[0] ?? '',
      /^Option A: There is .+ of at least one night colder than −?\d+ °C in the next \d+ years, the period over which the costs are compared\./,
    );
    assert.match(view.options[1]?.odds[0] ?? '', /^Option B: /);
    assert.equal(view.cautions.length, 4);
    // Written for a homeowner: none of the designer's terms or the internal scenario name in what the homeowner reads.
    const homeownerText = JSON.stringify([
      view.title,
      view.status,
      view.building,
      view.climate,
      view.cautionsTitle,
      view.cautions,
      view.provenance,
      view.options.map((o) => [
        o.heading,
        o.unit,
        o.capacity,
        o.sentence,
        o.figures.map((x) => [x.label, x.text]),
        o.odds,
      ]),
    ]);
    for (const jargon of [
      /unmet/i,
      /design (temperature|load|point)/i,
      /set-point/i,
      /\bsag\b/i,
      /ladder/i,
      /\brung/i,
      /life-cycle/i,
      /Gas bid/,
      /fall(s)? behind the load/i,
    ]) {
      assert.doesNotMatch(homeownerText, jargon);
    }
    // The designer who prepared it is the contact.
    assert.equal(view.contact.email, f.email);
    assert.ok(view.expiresAt);

    // The same figures as the signed-in preview.
    const preview = reportViewSchema.parse(
      (await f.agent.get(`/api/v1/projects/${f.projectId}/reports/${report.id}/view`).expect(200)).body,
    );
    assert.deepEqual(preview.options, view.options);
  });

  it('answers 410 with nothing of the report once a link is revoked or expired, and 404 for a forged token', async () => {
    const f = await fixture(t);
    const { report } = await reportOf(f);
    const base = `/api/v1/projects/${f.projectId}/reports/${report.id}`;
    const a = parseBody(linkCreatedSchema, await f.agent.post(`${base}/links`).send({}).expect(201));
    const b = parseBody(linkCreatedSchema, await f.agent.post(`${base}/links`).send({}).expect(201));
    const revoked = reportSchema.parse((await f.agent.delete(`${base}/links/${a.link.id}`).expect(200)).body);
    assert.equal(revoked.links.find((l) => l.id === a.link.id)?.status, 'revoked');
    const gone = await request(t.app)
      .get(`/api/v1/public/reports/${tokenOf(a.url)}`)
      .expect(410);
    assert.equal(parseError(gone).code, 'link_revoked');
    assert.doesNotMatch(JSON.stringify(gone.body), /heating options|F 9 kW/);
    await request(t.app)
      .get(`/api/v1/public/reports/${tokenOf(a.url)}/pdf`)
      .expect(410);

    await t
      .db('report_links')
      .where({ id: b.link.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await request(t.app)
      .get(`/api/v1/public/reports/${tokenOf(b.url)}`)
      .expect(410);
    assert.equal(parseError(expired).code, 'link_expired');

    const forged = newReportToken('not-the-server-secret-but-long-enough').token;
    await request(t.app).get(`/api/v1/public/reports/${forged}`).expect(404);
    await request(t.app).get('/api/v1/public/reports/..%2F..%2Fetc%2Fpasswd').expect(404);
  });

  it('produces a PDF whose text holds the report’s key figures', async () => {
    const f = await fixture(t);
    const { report } = await reportOf(f, { unitSystem: 'IP' });
    const { url } = parseBody(
      linkCreatedSchema,
      await f.agent.post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`).send({}).expect(201),
    );
    const view = reportViewSchema.parse(
      (
        await request(t.app)
          .get(`/api/v1/public/reports/${tokenOf(url)}`)
          .expect(200)
      ).body,
    );
    const res = await request(t.app)
      .get(`/api/v1/public/reports/${tokenOf(url)}/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    assert.match(res.headers['content-type'] ?? '', /application\/pdf/);
    const text = (await pdfText(bodyBytes(res))).replace(/\s+/g, ' ');
    assert.ok(text.includes('Your heating options'));
    for (const o of view.options) {
      assert.ok(text.includes(o.unit), `unit ${o.unit}`);
      const price = o.figures.find((x) => x.key === 'installedPrice')?.text ?? '?';
      assert.ok(text.includes(price), `price ${price}`);
    }
    assert.match(text, /°F/);
    assert.match(text, /licensed heating professional/);
    assert.match(text, /Questions\?/);
    assert.doesNotMatch(text, /Gas bid/);
  });

  it('e-mails the link through the sink, records the send, and records a failed send for a retry', async () => {
    const f = await fixture(t);
    const { report } = await reportOf(f);
    const base = `/api/v1/projects/${f.projectId}/reports/${report.id}`;
    const mail = t.sink.waitFor((m) => m.to.includes('client@example.test'));
    const sent = reportSchema.parse(
      (await f.agent.post(`${base}/send`).send({ to: 'client@example.test', message: 'As discussed.' }).expect(201))
        .body,
    );
    assert.equal(sent.sends[0]?.status, 'sent');
    assert.equal(sent.links.length, 1);
    const m = await mail;
    assert.match(m.text, /As discussed\./);
    // Replies reach the designer who sent it, not the product's sending address (RFC 5322 §3.6.2 Reply-To).
    assert.match(m.replyTo, new RegExp(f.email.replace(/[.+]/g, '\\$&')));
    assert.doesNotMatch(m.from, new RegExp(f.email.replace(/[.+]/g, '\\$&')));
    assert.match(m.text, /Reply to this e-mail/);
    const link = /http:\/\/tailroom\.test\/r\/([\w.-]+)/.exec(m.text)?.[1] ?? '';
    await request(t.app).get(`/api/v1/public/reports/${link}`).expect(200);

    // A mailer that cannot reach its SMTP server: the send is recorded as failed, its link withdrawn.
    const broken = await createTestApp({ SMTP_PORT: '9' });
    try {
      // The account is made where mail works; its owner then signs in on the app that cannot send.
      const g = await fixture(t);
      const { report: r2 } = await reportOf(g);
      const owner = newAgent(broken.app);
      await owner.post('/api/v1/auth/sign-in').send({ email: g.email, password: PASSWORD }).expect(200);
      const res = await owner
        .post(`/api/v1/projects/${g.projectId}/reports/${r2.id}/send`)
        .send({ to: 'client@example.test' })
        .expect(502);
      const body = parseBody(sendFailedSchema, res);
      assert.equal(body.error.code, 'send_failed');
      assert.equal(body.report.sends[0]?.status, 'failed');
      assert.equal(body.report.links[0]?.status, 'revoked');
    } finally {
      await broken.close();
    }
    // A retry (here, where the sink works) sends again with a new link.
    const failedId = (
      await t
        .db('report_sends')
        .insert({ report_id: report.id, recipient: 'late@example.test', status: 'failed', error: 'timeout' })
        .returning<{ id: string }[]>('id')
    )[0]?.id;
    const again = t.sink.waitFor((x) => x.to.includes('late@example.test'));
    await f.agent.post(`${base}/sends/${failedId}/retry`).send({}).expect(201);
    await again;
  });

  it('keeps reports to their organisation and to designers and owners', async () => {
    const f = await fixture(t);
    const { report } = await reportOf(f);
    const viewer = await inviteMember(t, { agent: f.agent }, 'viewer');
    await viewer.agent.get(`/api/v1/projects/${f.projectId}/reports`).expect(200);
    await viewer.agent.post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`).send({}).expect(403);
    await viewer.agent
      .post(`/api/v1/projects/${f.projectId}/reports/${report.id}/send`)
      .send({ to: 'x@example.test' })
      .expect(403);
    const other = await signUp(t);
    await other.agent.get(`/api/v1/projects/${f.projectId}/reports/${report.id}`).expect(404);
    await other.agent.get(`/api/v1/projects/${f.projectId}/reports/${report.id}/view`).expect(404);
    await other.agent.post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`).send({}).expect(404);
    const bad = await f.agent
      .post(`/api/v1/projects/${f.projectId}/reports`)
      .send({ scenarioId: report.scenarioId, title: '', points: [], figures: ['nope'] })
      .expect(400);
    const paths = (parseError(bad).details ?? []).map((d) => d.path).sort();
    assert.deepEqual(paths, ['figures.0', 'points', 'title']);
  });

  it('takes a PNG or a cleaned SVG as the logo, judged by content, and refuses anything else', async () => {
    const f = await fixture(t);
    const png = Buffer.from(
      '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478016390f58bff0f00032001cac83ac1f10000000049454e44ae426082',
      'hex',
    );
    await f.agent.put('/api/v1/organization/logo').attach('logo', png, 'firm.png').expect(200);
    const got = await f.agent.get('/api/v1/organization/logo').expect(200);
    assert.equal(got.headers['content-type'], 'image/png');
    const fake = await f.agent
      .put('/api/v1/organization/logo')
      .attach('logo', Buffer.from('MZ not an image'), 'logo.png')
      .expect(400);
    assert.equal(parseError(fake).code, 'invalid_file');
    const svg =
      '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10" onload="alert(1)"><script>alert(2)</script><rect width="10" height="10" fill="#1D4E5F"/><a href="javascript:alert(3)"><circle r="2"/></a></svg>';
    await f.agent.put('/api/v1/organization/logo').attach('logo', Buffer.from(svg), 'firm.svg').expect(200);
    const served = await f.agent.get('/api/v1/organization/logo').expect(200);
    assert.equal(served.headers['content-type'], 'image/svg+xml');
    assert.match(served.headers['content-security-policy'] ?? '', /default-src 'none'/);
    const row = await t.db('organization_logos').first<{ content: Buffer }>('content');
    const stored = row.content.toString('utf8');
    assert.doesNotMatch(stored, /script|onload|javascript/i);
    assert.match(stored, /<rect/);
    await f.agent
      .put('/api/v1/organization/logo')
      .attach('logo', Buffer.alloc(1024 * 1024 + 1, 0x89), 'big.png')
      .expect(413);
    const viewer = await inviteMember(t, { agent: f.agent }, 'designer');
    await viewer.agent.put('/api/v1/organization/logo').attach('logo', png, 'firm.png').expect(403);
  });

  it('sniffs image types from bytes and strips active SVG content', () => {
    assert.equal(sniffImage(Buffer.from([0xff, 0xd8, 0xff, 0xe0])), 'image/jpeg');
    assert.equal(sniffImage(Buffer.from('<?xml version="1.0"?>\n<svg></svg>')), 'image/svg+xml');
    assert.equal(sniffImage(Buffer.from('<html><svg></svg></html>')), null);
    assert.equal(sanitizeSvg('<svg><foreignObject><iframe src="x"/></foreignObject></svg>')?.includes('iframe'), false);
  });
});
