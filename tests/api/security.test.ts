/**
 * Security at the edge: headers and the content-security policy (helmet), CSRF (the custom-header
 * check of OWASP's CSRF Prevention Cheat Sheet, plus the Origin check), rate limits answering 429,
 * signing out everywhere, and the audit log owners read.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import { CSRF_HEADER } from '../../shared/api/csrf';
import { auditLogSchema } from '../../shared/orgs/org-schemas';
import { parseBody, parseError } from '../support/parse-body';
import { createTestApp, inviteMember, newAgent, PASSWORD, signUp, uniqueEmail, useTestApp } from '../support/test-app';

const t = useTestApp();

describe('security', () => {
  it('sends a strict content-security policy and the other protective headers', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    const csp = res.headers['content-security-policy'] ?? '';
    assert.match(csp, /script-src 'self'(;|$)/);
    assert.match(csp, /frame-ancestors 'none'/);
    assert.match(csp, /object-src 'none'/);
    assert.doesNotMatch(csp, /script-src[^;]*unsafe/);
    assert.equal(res.headers['x-content-type-options'], 'nosniff');
    assert.equal(res.headers['x-powered-by'], undefined);
  });

  it('refuses a signed-in state change without the CSRF header, or from another site, and stores nothing', async () => {
    const owner = await signUp(t);
    const cookie = (await t.db('session').count<{ n: number }[]>('sid as n'))[0]?.n;
    assert.ok(cookie);
    const bare = await owner.agent.post('/api/v1/projects').unset(CSRF_HEADER).send({ name: 'No header' }).expect(403);
    assert.equal(parseError(bare).code, 'csrf');
    await owner.agent
      .post('/api/v1/projects')
      .set('Origin', 'https://evil.example')
      .send({ name: 'Cross-site' })
      .expect(403);
    assert.equal((await t.db('projects').count<{ n: number }[]>('id as n'))[0]?.n, 0);
    await owner.agent.post('/api/v1/projects').send({ name: 'Fine' }).expect(201);
    await owner.agent.get('/api/v1/projects').unset(CSRF_HEADER).expect(200);
  });

  it('limits failed sign-ins to 10 in 15 minutes per address and e-mail, with a clear 429', async () => {
    const owner = await signUp(t);
    const email = owner.email;
    for (let i = 0; i < 10; i++) {
      await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: 'wrong password here' }).expect(401);
    }
    const limited = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(429);
    assert.equal(parseError(limited).code, 'rate_limited');
    assert.match(parseError(limited).message, /Too many failed sign-ins/);
    assert.ok(limited.headers['ratelimit'] ?? limited.headers['ratelimit-policy'], 'rate-limit headers');
    // Another address is not held up by it.
    const other = await signUp(t);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email: other.email, password: PASSWORD }).expect(200);
  });

  it('limits sign-ups to SIGN_UP_PER_HOUR per network address and 5 an hour to one e-mail address, with a clear 429', async () => {
    const own = await createTestApp({ SIGN_UP_PER_HOUR: '8' });
    try {
      const target = uniqueEmail('target');
      for (let i = 0; i < 5; i++) {
        await request(own.app).post('/api/v1/auth/sign-up').send({ email: target, name: 'Again' }).expect(202);
      }
      const sameAddress = await request(own.app)
        .post('/api/v1/auth/sign-up')
        .send({ email: target, name: 'Again' })
        .expect(429);
      assert.match(parseError(sameAddress).message, /Too many sign-up requests for this e-mail address/);
      // Refused requests count too: 6 so far from this network address; two more, then the limit.
      for (let i = 0; i < 2; i++) {
        await request(own.app).post('/api/v1/auth/sign-up').send({ email: uniqueEmail(), name: 'Other' }).expect(202);
      }
      const tooMany = await request(own.app)
        .post('/api/v1/auth/sign-up')
        .send({ email: uniqueEmail(), name: 'Other' })
        .expect(429);
      assert.equal(parseError(tooMany).code, 'rate_limited');
      assert.match(parseError(tooMany).message, /Too many sign-up requests;/);
      const stored = await own.db('sign_up_requests').count<{ count: number }[]>('* as count');
      assert.equal(stored[0]?.count, 7, 'a refused request stores nothing');
    } finally {
      await own.db('sign_up_requests').delete();
      await own.close();
    }
  });

  it('signs a user out everywhere: every session of theirs ends', async () => {
    const owner = await signUp(t);
    const second = newAgent(t.app);
    await second.post('/api/v1/auth/sign-in').send({ email: owner.email, password: PASSWORD }).expect(200);
    await second.get('/api/v1/projects').expect(200);
    await owner.agent.post('/api/v1/auth/sign-out-everywhere').send({}).expect(204);
    await second.get('/api/v1/projects').expect(401);
    await owner.agent.get('/api/v1/projects').expect(401);
  });

  it('keeps an audit log of security events that owners can read', async () => {
    const owner = await signUp(t);
    await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: owner.email, password: 'wrong password here' })
      .expect(401);
    await newAgent(t.app).post('/api/v1/auth/sign-in').send({ email: owner.email, password: PASSWORD }).expect(200);
    const designer = await inviteMember(t, owner, 'designer');
    await owner.agent.patch(`/api/v1/members/${designer.userId}`).send({ role: 'viewer' }).expect(200);
    const log = parseBody(auditLogSchema, await owner.agent.get('/api/v1/audit').expect(200));
    const types = log.map((e) => e.type);
    for (const ty of [
      'account_created',
      'sign_in_failed',
      'sign_in',
      'invitation_created',
      'member_joined',
      'role_changed',
    ])
      assert.ok(types.includes(ty), `${ty} in ${types.join(', ')}`);
    await designer.agent.get('/api/v1/audit').expect(403);
  });
});
