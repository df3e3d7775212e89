import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import { parseError } from '../support/parse-body';
import {
  inviteMember,
  linkPath,
  linkToken,
  PASSWORD,
  signUp,
  uniqueEmail,
  useTestApp,
  newAgent,
} from '../support/test-app';

const t = useTestApp();

const cookieOf = (res: request.Response): string => {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const cookie = raw?.find((c) => c.startsWith('tailroom.sid='));
  assert.ok(cookie, 'a session cookie is set');
  return cookie;
};

/** Starts a sign-up and returns the token of the e-mailed link (and the 202 answer). */
async function startSignUp(body: Record<string, unknown>) {
  const email = String(body['email']).trim().toLowerCase();
  const mail = t.sink.waitFor((m) => m.to.includes(email));
  const res = await newAgent(t.app).post('/api/v1/auth/sign-up').send(body).expect(202);
  const sent = await mail;
  return {
    res,
    mail: sent,
    token: sent.text.includes('/finish-sign-up/') ? linkToken(sent.text, '/finish-sign-up/') : null,
  };
}

describe('create account', () => {
  it('e-mails a link for a new address; the password chosen there makes the user, an organisation they own, and a session', async () => {
    const { res, mail, token } = await startSignUp({ email: '  Ada@Example.TEST ', name: 'Ada Byrne' });
    assert.equal(res.body.email, 'ada@example.test');
    assert.match(res.body.message, /ada@example\.test/);
    assert.equal(mail.subject, 'Finish creating your Tailroom account');
    assert.ok(token);
    assert.equal(await t.db('users').first(), undefined, 'no account before the link is followed');

    const agent = newAgent(t.app);
    const pending = await agent.get(`/api/v1/auth/sign-ups/${token}`).expect(200);
    assert.deepEqual(
      { ...pending.body, expiresAt: undefined },
      { email: 'ada@example.test', name: 'Ada Byrne', organizationName: null, expiresAt: undefined },
    );
    const hours = (Date.parse(pending.body.expiresAt) - Date.now()) / 3_600_000;
    assert.ok(hours > 23.9 && hours <= 24, `the link works for 24 hours (${hours.toFixed(2)})`);

    const done = await agent.post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(201);
    assert.equal(done.body.user.email, 'ada@example.test');
    assert.equal(done.body.organizations.length, 1);
    assert.equal(done.body.organizations[0].role, 'owner');
    assert.equal(done.body.organizations[0].name, "Ada Byrne's firm");
    assert.equal(done.body.currentOrganizationId, done.body.organizations[0].id);
    const session = await agent.get('/api/v1/session').expect(200);
    assert.equal(session.body.user.name, 'Ada Byrne');
    const events = await t
      .db('audit_events')
      .where({ type: 'account_created' })
      .select('organization_id', 'actor_email');
    assert.deepEqual(events, [{ organization_id: done.body.currentOrganizationId, actor_email: 'ada@example.test' }]);

    // The link works once.
    const again = await newAgent(t.app).post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(400);
    assert.equal(again.body.error.code, 'invalid_sign_up_link');
    await newAgent(t.app).get(`/api/v1/auth/sign-ups/${token}`).expect(400);
  });

  it('answers an address that has an account exactly as a new one, and e-mails it a note with no link to finish', async () => {
    const { email } = await signUp(t, { name: 'First Owner' });
    const fresh = await startSignUp({ email: uniqueEmail('fresh'), name: 'Someone' });
    const taken = await startSignUp({ email: email.toUpperCase(), name: 'Twin' });
    assert.equal(taken.res.status, fresh.res.status);
    assert.deepEqual(Object.keys(taken.res.body).sort(), Object.keys(fresh.res.body).sort());
    assert.equal(taken.res.body.message, fresh.res.body.message.replace(fresh.res.body.email, email));
    assert.equal(taken.token, null, 'no finishing link to an address that has an account');
    assert.equal(taken.mail.subject, 'You already have a Tailroom account');
    assert.match(taken.mail.text, /\/sign-in/);
    assert.match(taken.mail.text, /\/forgot-password/);
    const count = await t.db('users').count<{ count: number }[]>('* as count');
    assert.equal(count[0]?.count, 1);
  });

  it('uses the organisation name given, and carries a return path of this site in the link', async () => {
    const { token, mail } = await startSignUp({
      email: uniqueEmail(),
      name: 'Bo',
      organizationName: 'Bo Heating',
      returnUrl: '/invitations/abc?x=1',
    });
    assert.match(mail.text, /\/finish-sign-up\/[A-Za-z0-9_-]+\?returnUrl=%2Finvitations%2Fabc%3Fx%3D1/);
    const done = await newAgent(t.app).post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(201);
    assert.equal(done.body.organizations[0].name, 'Bo Heating');
    for (const returnUrl of ['//elsewhere.example/x', 'https://elsewhere.example/', '/\\elsewhere', 'relative']) {
      const res = await newAgent(t.app)
        .post('/api/v1/auth/sign-up')
        .send({ email: uniqueEmail(), name: 'X', returnUrl })
        .expect(400);
      assert.deepEqual(
        (parseError(res).details ?? []).map((d) => d.path),
        ['returnUrl'],
        returnUrl,
      );
    }
  });

  it('sets an httpOnly, SameSite=Lax session cookie when the account is made', async () => {
    const { token } = await startSignUp({ email: uniqueEmail(), name: 'Cookie Check' });
    const res = await request(t.app).post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(201);
    const cookie = cookieOf(res);
    assert.match(cookie, /HttpOnly/i);
    assert.match(cookie, /SameSite=Lax/i);
  });

  it('refuses a password shorter than 12 characters with a field-level message, keeping the link usable', async () => {
    const email = uniqueEmail();
    const { token } = await startSignUp({ email, name: 'Short' });
    const res = await newAgent(t.app)
      .post(`/api/v1/auth/sign-ups/${token}`)
      .send({ password: 'elevenchars' })
      .expect(400);
    assert.equal(res.body.error.code, 'invalid_input');
    assert.deepEqual(
      (parseError(res).details ?? []).map((d) => d.path),
      ['password'],
    );
    assert.equal(await t.db('users').where({ email }).first(), undefined);
    await newAgent(t.app).post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(201);
  });

  it('makes one account from two open links, and says so (409) to whoever follows the other', async () => {
    const email = uniqueEmail();
    const first = await startSignUp({ email, name: 'One' });
    const second = await startSignUp({ email, name: 'Two' });
    await newAgent(t.app).post(`/api/v1/auth/sign-ups/${second.token}`).send({ password: PASSWORD }).expect(201);
    // Finishing ends every open request for the address.
    const late = await newAgent(t.app)
      .post(`/api/v1/auth/sign-ups/${first.token}`)
      .send({ password: PASSWORD })
      .expect(400);
    assert.equal(late.body.error.code, 'invalid_sign_up_link');
    const count = await t.db('users').where({ email }).count<{ count: number }[]>('* as count');
    assert.equal(count[0]?.count, 1);
  });

  it('answers 409 email_taken to a link whose address got an account another way meanwhile', async () => {
    const owner = await signUp(t);
    const email = uniqueEmail('invitee');
    const { token } = await startSignUp({ email, name: 'Invitee' });
    await inviteMember(t, owner, 'viewer', email);
    const res = await newAgent(t.app).post(`/api/v1/auth/sign-ups/${token}`).send({ password: PASSWORD }).expect(409);
    assert.equal(res.body.error.code, 'email_taken');
    const count = await t.db('users').where({ email }).count<{ count: number }[]>('* as count');
    assert.equal(count[0]?.count, 1);
  });

  it('refuses an expired, unknown or malformed link with 400 and makes nothing', async () => {
    const { token } = await startSignUp({ email: uniqueEmail(), name: 'Late' });
    await t.db('sign_up_requests').update({ expires_at: t.db.raw("now() - interval '1 minute'") });
    for (const link of [token, 'A'.repeat(43), 'not a token', '..%2F..%2Fetc']) {
      const res = await newAgent(t.app).post(`/api/v1/auth/sign-ups/${link}`).send({ password: PASSWORD });
      assert.equal(res.status, 400, String(link));
      assert.equal(res.body.error.code, 'invalid_sign_up_link');
    }
    assert.equal(await t.db('users').first(), undefined);
  });
});

describe('bad input gets a clear 4xx and stores nothing', () => {
  const cases: [string, () => request.Test, number, string][] = [
    [
      'malformed JSON',
      () =>
        request(t.app).post('/api/v1/auth/sign-up').set('content-type', 'application/json').send('{"email": "a@b.c",'),
      400,
      'malformed_json',
    ],
    [
      'wrong types',
      () =>
        request(t.app)
          .post('/api/v1/auth/sign-up')
          .send({ email: 42, name: ['x'], password: true }),
      400,
      'invalid_input',
    ],
    [
      'unknown fields',
      () => request(t.app).post('/api/v1/auth/sign-up').send({ email: 'x@example.test', name: 'X', isAdmin: true }),
      400,
      'invalid_input',
    ],
    [
      'an oversized body',
      () =>
        request(t.app)
          .post('/api/v1/auth/sign-up')
          .send({ email: 'x@example.test', name: 'y'.repeat(1_200_000) }),
      413,
      'payload_too_large',
    ],
    ['no body at all', () => request(t.app).post('/api/v1/auth/sign-up'), 400, 'invalid_input'],
  ];
  for (const [label, send, status, code] of cases) {
    it(`answers ${status} ${code} to ${label}`, async () => {
      const res = await send().expect(status);
      assert.equal(res.body.error.code, code);
      assert.equal(typeof res.body.error.message, 'string');
      assert.ok(!JSON.stringify(res.body).includes('    at '), 'no stack trace');
      const users = await t.db('users').count<{ count: number }[]>('* as count');
      assert.equal(users[0]?.count, 0);
      const requests = await t.db('sign_up_requests').count<{ count: number }[]>('* as count');
      assert.equal(requests[0]?.count, 0);
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
    const { email, agent } = await signUp(t);
    const first = await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    const second = await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    const id = (res: request.Response) => cookieOf(res).split(';')[0];
    assert.notEqual(id(first), id(second), 'a new session id at each sign-in');
    assert.equal(second.body.user.email, email);
    // The session id held before signing in no longer works (session fixation).
    await request(t.app)
      .get('/api/v1/members')
      .set('cookie', id(first) ?? '')
      .expect(401);
    await request(t.app)
      .get('/api/v1/members')
      .set('cookie', id(second) ?? '')
      .expect(200);
  });

  it('answers a wrong password and an unknown e-mail alike', async () => {
    const { email } = await signUp(t);
    const wrong = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email, password: 'not the password' })
      .expect(401);
    const unknown = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'nobody@example.test', password: 'not the password' })
      .expect(401);
    assert.deepEqual(wrong.body, unknown.body);
    assert.equal(wrong.body.error.code, 'invalid_credentials');
  });

  it('signs out: the session ends on the server', async () => {
    const { agent } = await signUp(t);
    await agent.get('/api/v1/members').expect(200);
    await agent.post('/api/v1/auth/sign-out').expect(204);
    await agent.get('/api/v1/members').expect(401);
    const session = await agent.get('/api/v1/session').expect(200);
    assert.equal(session.body.user, null);
  });

  it('keeps sessions in PostgreSQL', async () => {
    const { userId } = await signUp(t);
    const rows = await t.db.raw(`SELECT count(*)::int AS n FROM "session" WHERE (sess -> 'passport' ->> 'user') = ?`, [
      userId,
    ]);
    assert.equal(rows.rows[0].n, 1);
  });
});

describe('password reset by e-mail', () => {
  it('e-mails a single-use link whose token is stored only as a hash, and sets the new password', async () => {
    const { email, agent: oldSession } = await signUp(t);
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
    const { email } = await signUp(t);
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    await request(t.app).post('/api/v1/auth/password-resets').send({ email }).expect(202);
    const token = linkPath((await mail).text, '/reset-password/')
      .split('/')
      .pop();
    await t.db('password_resets').update({ expires_at: new Date(Date.now() - 1000) });
    await request(t.app)
      .post(`/api/v1/auth/password-resets/${token}`)
      .send({ password: 'a brand new passphrase' })
      .expect(400);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
  });

  it('answers an unknown address exactly as a known one, and sends nothing', async () => {
    const { email } = await signUp(t);
    const known = await request(t.app).post('/api/v1/auth/password-resets').send({ email }).expect(202);
    const unknown = await request(t.app)
      .post('/api/v1/auth/password-resets')
      .send({ email: 'ghost@example.test' })
      .expect(202);
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
    const { agent, email } = await signUp(t);
    const res = await agent.patch('/api/v1/me').send({ unitSystem: 'IP' }).expect(200);
    assert.equal(res.body.user.unitSystem, 'IP');
    await agent.post('/api/v1/auth/sign-out').expect(204);
    const again = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    assert.equal(again.body.user.unitSystem, 'IP');
    await agent.patch('/api/v1/me').send({ unitSystem: 'metric' }).expect(401);
  });

  it('refuses an unknown unit system', async () => {
    const { agent } = await signUp(t);
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
