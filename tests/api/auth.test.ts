import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import { linkPath, PASSWORD, signUp, uniqueEmail, useTestApp, newAgent } from '../support/test-app';

const t = useTestApp();

const cookieOf = (res: request.Response): string => {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const cookie = raw?.find((c) => c.startsWith('tailroom.sid='));
  assert.ok(cookie, 'a session cookie is set');
  return cookie;
};

describe('create account', () => {
  it('creates the user, an organisation they own, and signs them in', async () => {
    const agent = newAgent(t.app);
    const res = await agent
      .post('/api/v1/auth/sign-up')
      .send({ email: '  Ada@Example.TEST ', name: 'Ada Byrne', password: PASSWORD })
      .expect(201);
    assert.equal(res.body.user.email, 'ada@example.test');
    assert.equal(res.body.organizations.length, 1);
    assert.equal(res.body.organizations[0].role, 'owner');
    assert.equal(res.body.organizations[0].name, "Ada Byrne's firm");
    assert.equal(res.body.currentOrganizationId, res.body.organizations[0].id);
    const session = await agent.get('/api/v1/session').expect(200);
    assert.equal(session.body.user.name, 'Ada Byrne');
  });

  it('stores an argon2id hash with the OWASP parameters (m=19456 KiB, t=2, p=1), never the password', async () => {
    // OWASP Password Storage Cheat Sheet, "Argon2id": m=19456 (19 MiB), t=2, p=1.
    const { email } = await signUp(t.app);
    const row = await t.db('users').where({ email }).first<{ password_hash: string }>('password_hash');
    assert.match(row.password_hash, /^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    assert.ok(!row.password_hash.includes(PASSWORD));
  });

  it('sets an httpOnly, SameSite=Lax session cookie', async () => {
    const res = await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email: uniqueEmail(), name: 'Cookie Check', password: PASSWORD })
      .expect(201);
    const cookie = cookieOf(res);
    assert.match(cookie, /HttpOnly/i);
    assert.match(cookie, /SameSite=Lax/i);
  });

  it('refuses a password shorter than 12 characters, with a field-level message, and stores nothing', async () => {
    const email = uniqueEmail();
    const res = await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email, name: 'Short', password: 'elevenchars' })
      .expect(400);
    assert.equal(res.body.error.code, 'invalid_input');
    assert.deepEqual(
      res.body.error.details.map((d: { path: string }) => d.path),
      ['password'],
    );
    assert.equal(await t.db('users').where({ email }).first(), undefined);
  });

  it('refuses a second account with the same e-mail (409)', async () => {
    const { email } = await signUp(t.app);
    const res = await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email: email.toUpperCase(), name: 'Twin', password: PASSWORD })
      .expect(409);
    assert.equal(res.body.error.code, 'email_taken');
    const count = await t.db('users').count<{ count: number }[]>('* as count');
    assert.equal(count[0]?.count, 1);
  });
});

describe('bad input gets a clear 4xx and stores nothing', () => {
  const cases: [string, () => request.Test, number, string][] = [
    [
      'malformed JSON',
      () => request(t.app).post('/api/v1/auth/sign-up').set('content-type', 'application/json').send('{"email": "a@b.c",'),
      400,
      'malformed_json',
    ],
    [
      'wrong types',
      () => request(t.app).post('/api/v1/auth/sign-up').send({ email: 42, name: ['x'], password: true }),
      400,
      'invalid_input',
    ],
    [
      'unknown fields',
      () =>
        request(t.app)
          .post('/api/v1/auth/sign-up')
          .send({ email: 'x@example.test', name: 'X', password: PASSWORD, isAdmin: true }),
      400,
      'invalid_input',
    ],
    [
      'an oversized body',
      () =>
        request(t.app)
          .post('/api/v1/auth/sign-up')
          .send({ email: 'x@example.test', name: 'y'.repeat(1_200_000), password: PASSWORD }),
      413,
      'payload_too_large',
    ],
    [
      'no body at all',
      () => request(t.app).post('/api/v1/auth/sign-up'),
      400,
      'invalid_input',
    ],
  ];
  for (const [label, send, status, code] of cases) {
    it(`answers ${status} ${code} to ${label}`, async () => {
      const res = await send().expect(status);
      assert.equal(res.body.error.code, code);
      assert.equal(typeof res.body.error.message, 'string');
      assert.ok(!JSON.stringify(res.body).includes('    at '), 'no stack trace');
      const users = await t.db('users').count<{ count: number }[]>('* as count');
      assert.equal(users[0]?.count, 0);
    });
  }

  it('names each unknown field in the details', async () => {
    const res = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'x@example.test', password: 'p', remember: 1 })
      .expect(400);
    assert.deepEqual(res.body.error.details, [{ path: 'remember', message: 'Unknown field' }]);
  });

  it('answers unknown API paths with 404 in the error shape', async () => {
    const res = await request(t.app).get('/api/v1/no-such-thing').expect(404);
    assert.equal(res.body.error.code, 'not_found');
  });
});

describe('sign in and sign out', () => {
  it('signs in with the right password and regenerates the session id', async () => {
    const { email, agent } = await signUp(t.app);
    const first = await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    const second = await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    const id = (res: request.Response) => cookieOf(res).split(';')[0];
    assert.notEqual(id(first), id(second), 'a new session id at each sign-in');
    assert.equal(second.body.user.email, email);
    // The session id held before signing in no longer works (session fixation).
    await request(t.app).get('/api/v1/members').set('cookie', id(first) ?? '').expect(401);
    await request(t.app).get('/api/v1/members').set('cookie', id(second) ?? '').expect(200);
  });

  it('answers a wrong password and an unknown e-mail alike', async () => {
    const { email } = await signUp(t.app);
    const wrong = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: 'not the password' }).expect(401);
    const unknown = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'nobody@example.test', password: 'not the password' })
      .expect(401);
    assert.deepEqual(wrong.body, unknown.body);
    assert.equal(wrong.body.error.code, 'invalid_credentials');
  });

  it('signs out: the session ends on the server', async () => {
    const { agent } = await signUp(t.app);
    await agent.get('/api/v1/members').expect(200);
    await agent.post('/api/v1/auth/sign-out').expect(204);
    await agent.get('/api/v1/members').expect(401);
    const session = await agent.get('/api/v1/session').expect(200);
    assert.equal(session.body.user, null);
  });

  it('keeps sessions in PostgreSQL', async () => {
    const { userId } = await signUp(t.app);
    const rows = await t.db.raw(`SELECT count(*)::int AS n FROM "session" WHERE (sess -> 'passport' ->> 'user') = ?`, [userId]);
    assert.equal(rows.rows[0].n, 1);
  });
});

describe('password reset by e-mail', () => {
  it('e-mails a single-use link whose token is stored only as a hash, and sets the new password', async () => {
    const { email, agent: oldSession } = await signUp(t.app);
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    await request(t.app).post('/api/v1/auth/password-resets').send({ email }).expect(202);
    const message = await mail;
    const path = linkPath(message.text, '/reset-password/');
    const token = path.split('/').pop() ?? '';
    assert.ok(token.length >= 40);

    const stored = await t.db('password_resets').select('token_hash');
    assert.equal(stored.length, 1);
    assert.notEqual(stored[0].token_hash, token);
    assert.ok(!JSON.stringify(stored).includes(token), 'the token itself is not stored');

    const newPassword = 'a brand new passphrase';
    await request(t.app).post(`/api/v1/auth/password-resets/${token}`).send({ password: newPassword }).expect(204);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(401);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: newPassword }).expect(200);
    // Single use.
    const again = await request(t.app)
      .post(`/api/v1/auth/password-resets/${token}`)
      .send({ password: 'yet another passphrase' })
      .expect(400);
    assert.equal(again.body.error.code, 'invalid_reset_link');
    // Sessions opened with the old password are ended.
    await oldSession.get('/api/v1/members').expect(401);
  });

  it('refuses an expired link', async () => {
    const { email } = await signUp(t.app);
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    await request(t.app).post('/api/v1/auth/password-resets').send({ email }).expect(202);
    const token = linkPath((await mail).text, '/reset-password/').split('/').pop();
    await t.db('password_resets').update({ expires_at: new Date(Date.now() - 1000) });
    await request(t.app).post(`/api/v1/auth/password-resets/${token}`).send({ password: 'a brand new passphrase' }).expect(400);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
  });

  it('answers an unknown address exactly as a known one, and sends nothing', async () => {
    const { email } = await signUp(t.app);
    const known = await request(t.app).post('/api/v1/auth/password-resets').send({ email }).expect(202);
    const unknown = await request(t.app).post('/api/v1/auth/password-resets').send({ email: 'ghost@example.test' }).expect(202);
    assert.deepEqual(known.body, unknown.body);
    await new Promise((r) => setTimeout(r, 300));
    assert.equal(t.sink.messages().filter((m) => m.to.includes('ghost@example.test')).length, 0);
  });

  it('checks the new password like sign-up does', async () => {
    const res = await request(t.app)
      .post('/api/v1/auth/password-resets/' + 'x'.repeat(43))
      .send({ password: 'short' })
      .expect(400);
    assert.equal(res.body.error.details[0].path, 'password');
  });
});

describe('preferences', () => {
  it('persists the unit system per user', async () => {
    const { agent, email } = await signUp(t.app);
    const res = await agent.patch('/api/v1/me').send({ unitSystem: 'IP' }).expect(200);
    assert.equal(res.body.user.unitSystem, 'IP');
    await agent.post('/api/v1/auth/sign-out').expect(204);
    const again = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    assert.equal(again.body.user.unitSystem, 'IP');
    await agent.patch('/api/v1/me').send({ unitSystem: 'metric' }).expect(401);
  });

  it('refuses an unknown unit system', async () => {
    const { agent } = await signUp(t.app);
    const res = await agent.patch('/api/v1/me').send({ unitSystem: 'metric' }).expect(400);
    assert.equal(res.body.error.details[0].path, 'unitSystem');
  });
});

describe('health', () => {
  it('reports the database as up', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    assert.deepEqual(res.body, { status: 'ok', database: 'up' });
  });
});
