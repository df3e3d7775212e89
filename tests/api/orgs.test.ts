import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { sessionSchema } from '../../shared/auth/auth-schemas';
import {
  invitationListSchema,
  invitationSchema,
  memberListSchema,
  outboxMessageListSchema,
} from '../../shared/orgs/org-schemas';
import { parseBody, parseError } from '../support/parse-body';
import {
  createTestApp,
  linkPath,
  linkToken,
  PASSWORD,
  signUp,
  uniqueEmail,
  useTestApp,
  inviteMember,
  setPlan,
  newAgent,
} from '../support/test-app';

const t = useTestApp();

type Agent = InstanceType<typeof TestAgent>;

/** An owner's organisation with a member of `role` who accepted an e-mailed invitation. */
async function orgWithMember(role: 'owner' | 'designer' | 'viewer') {
  const owner = await signUp(t, { organizationName: 'Test Heating Ltd' });
  // Room for the member and a further invitation (the free plan holds two places).
  await setPlan(t.db, owner.organizationId);
  const member = await inviteMember(t, owner, role);
  return { owner, member, organizationId: owner.organizationId, token: member.token };
}

describe('the role × action matrix', () => {
  // Expected outcomes written from the role definitions in the product brief:
  // owner: everything; designer: creates and edits projects; viewer: reads, changes nothing.
  type Outcome = 'allowed' | 'forbidden';
  const matrix: {
    action: string;
    send: (agent: Agent, ctx: { ownerId: string; invitationId: string }) => request.Test;
    owner: Outcome;
    designer: Outcome;
    viewer: Outcome;
  }[] = [
    {
      action: 'list projects',
      send: (a) => a.get('/api/v1/projects'),
      owner: 'allowed',
      designer: 'allowed',
      viewer: 'allowed',
    },
    {
      action: 'create a project',
      send: (a) => a.post('/api/v1/projects').send({ name: 'Matrix house' }),
      owner: 'allowed',
      designer: 'allowed',
      viewer: 'forbidden',
    },
    {
      action: 'list members',
      send: (a) => a.get('/api/v1/members'),
      owner: 'allowed',
      designer: 'allowed',
      viewer: 'allowed',
    },
    {
      action: 'change a role',
      send: (a, c) => a.patch(`/api/v1/members/${c.ownerId}`).send({ role: 'owner' }),
      owner: 'allowed',
      designer: 'forbidden',
      viewer: 'forbidden',
    },
    {
      action: 'remove a member',
      send: (a) => a.delete(`/api/v1/members/${crypto.randomUUID()}`),
      owner: 'allowed', // 404 for an unknown member: the role check passed
      designer: 'forbidden',
      viewer: 'forbidden',
    },
    {
      action: 'list invitations',
      send: (a) => a.get('/api/v1/invitations'),
      owner: 'allowed',
      designer: 'forbidden',
      viewer: 'forbidden',
    },
    {
      action: 'invite',
      send: (a) => a.post('/api/v1/invitations').send({ email: uniqueEmail('matrix'), role: 'viewer' }),
      owner: 'allowed',
      designer: 'forbidden',
      viewer: 'forbidden',
    },
    {
      action: 'revoke an invitation',
      send: (a, c) => a.delete(`/api/v1/invitations/${c.invitationId}`),
      owner: 'allowed',
      designer: 'forbidden',
      viewer: 'forbidden',
    },
  ];

  for (const role of ['owner', 'designer', 'viewer'] as const) {
    it(`enforces what a ${role} may do`, async () => {
      const { owner, member } = await orgWithMember(role);
      const pending = await owner.agent
        .post('/api/v1/invitations')
        .send({ email: uniqueEmail('pending'), role: 'viewer' })
        .expect(201);
      const ctx = { ownerId: owner.userId, invitationId: parseBody(invitationSchema, pending).id };
      for (const row of matrix) {
        const res = await row.send(member.agent, ctx);
        if (row[role] === 'forbidden') {
          assert.equal(res.status, 403, `${role} → ${row.action}: ${res.status}`);
          assert.equal(res.body.error.code, 'forbidden');
        } else {
          assert.ok([200, 201, 204, 404].includes(res.status), `${role} → ${row.action}: ${res.status}`);
          if (res.status === 404) assert.equal(row.action, 'remove a member');
        }
      }
    });
  }

  it('answers 401 to every action without a session', async () => {
    const anon = newAgent(t.app);
    const ctx = { ownerId: crypto.randomUUID(), invitationId: crypto.randomUUID() };
    for (const row of matrix) {
      const res = await row.send(anon, ctx);
      assert.equal(res.status, 401, row.action);
      assert.equal(res.body.error.code, 'unauthenticated');
    }
  });
});

describe('invitations', () => {
  it('lets an existing account accept, then work in both organisations', async () => {
    const owner = await signUp(t, { organizationName: 'Inviting Firm' });
    const other = await signUp(t, { organizationName: 'Own Firm' });
    const mail = t.sink.waitFor((m) => m.to.includes(other.email));
    await owner.agent.post('/api/v1/invitations').send({ email: other.email, role: 'designer' }).expect(201);
    const message = await mail;
    assert.match(message.subject, /Inviting Firm/);
    const path = linkPath(message.text, '/invitations/');
    const token = path.split('/').pop();

    const preview = await request(t.app).get(`/api/v1/invitation-links/${token}`).expect(200);
    assert.equal(preview.body.organizationName, 'Inviting Firm');
    assert.equal(preview.body.role, 'designer');
    assert.equal(preview.body.accountExists, true);

    const accepted = await other.agent.post(`/api/v1/invitation-links/${token}/accept`).expect(200);
    assert.equal(accepted.body.organizations.length, 2);
    assert.equal(accepted.body.currentOrganizationId, owner.organizationId);
    await other.agent.post('/api/v1/projects').send({ name: 'Made as designer' }).expect(201);

    const switched = await other.agent
      .put('/api/v1/session/organization')
      .send({ organizationId: other.organizationId })
      .expect(200);
    assert.equal(switched.body.currentOrganizationId, other.organizationId);
    const own = await other.agent.get('/api/v1/projects').expect(200);
    assert.equal(own.body.length, 0, 'projects are scoped to the current organisation');

    await other.agent.post(`/api/v1/invitation-links/${token}/accept`).expect(410);
  });

  it('makes an account for the invited address only once, and says 409 to an address that has one', async () => {
    const owner = await signUp(t);
    await setPlan(t.db, owner.organizationId);
    const email = uniqueEmail('invitee');
    const joined = await inviteMember(t, owner, 'designer', email);
    const members = await owner.agent.get('/api/v1/members').expect(200);
    assert.deepEqual(
      parseBody(memberListSchema, members)
        .map((m) => [m.email, m.role])
        .sort(),
      [
        [email, 'designer'],
        [owner.email, 'owner'],
      ].sort(),
    );
    const events = await t.db('audit_events').where({ type: 'member_joined' }).select('organization_id', 'actor_email');
    assert.deepEqual(events, [{ organization_id: owner.organizationId, actor_email: email }]);
    await newAgent(t.app)
      .post(`/api/v1/invitation-links/${joined.token}/account`)
      .send({ name: 'Again', password: PASSWORD })
      .expect(410);

    // Someone with an account is invited: the link asks them to sign in rather than making a second account.
    const other = await signUp(t);
    const mail = t.sink.waitFor((m) => m.to.includes(other.email));
    await owner.agent.post('/api/v1/invitations').send({ email: other.email, role: 'viewer' }).expect(201);
    const token = linkToken((await mail).text, '/invitations/');
    const taken = await newAgent(t.app)
      .post(`/api/v1/invitation-links/${token}/account`)
      .send({ name: 'Twin', password: PASSWORD })
      .expect(409);
    assert.equal(taken.body.error.code, 'email_taken');
    const bad = await newAgent(t.app)
      .post(`/api/v1/invitation-links/${token}/account`)
      .send({ name: '', password: 'short' })
      .expect(400);
    assert.deepEqual((parseError(bad).details ?? []).map((d) => d.path).sort(), ['name', 'password']);
  });

  it('refuses the link to another signed-in account', async () => {
    const owner = await signUp(t);
    const stranger = await signUp(t);
    const email = uniqueEmail('invitee');
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    await owner.agent.post('/api/v1/invitations').send({ email, role: 'viewer' }).expect(201);
    const token = linkPath((await mail).text, '/invitations/')
      .split('/')
      .pop();
    const res = await stranger.agent.post(`/api/v1/invitation-links/${token}/accept`).expect(403);
    assert.equal(res.body.error.code, 'wrong_account');
    const members = await owner.agent.get('/api/v1/members').expect(200);
    assert.equal(members.body.length, 1);
  });

  it('expires, and can be revoked', async () => {
    const { owner, token } = await orgWithMember('viewer');
    await request(t.app).get(`/api/v1/invitation-links/${token}`).expect(410);

    const email = uniqueEmail('late');
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    const created = await owner.agent.post('/api/v1/invitations').send({ email, role: 'viewer' }).expect(201);
    const late = linkPath((await mail).text, '/invitations/')
      .split('/')
      .pop();
    await t
      .db('invitations')
      .where({ id: created.body.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await request(t.app).get(`/api/v1/invitation-links/${late}`).expect(410);
    assert.equal(expired.body.error.code, 'invitation_expired');
    const refused = await newAgent(t.app)
      .post(`/api/v1/invitation-links/${late}/account`)
      .send({ name: 'Late', password: PASSWORD })
      .expect(410);
    assert.equal(refused.body.error.code, 'invitation_expired');
    assert.equal(await t.db('users').where({ email }).first(), undefined, 'nothing stored');

    const statusesNow = async () => {
      const list = await owner.agent.get('/api/v1/invitations').expect(200);
      return Object.fromEntries(parseBody(invitationListSchema, list).map((i) => [i.id, i.status]));
    };
    assert.equal((await statusesNow())[created.body.id], 'expired');

    const again = await owner.agent.post('/api/v1/invitations').send({ email, role: 'viewer' }).expect(201);
    assert.equal((await statusesNow())[again.body.id], 'pending');
    await owner.agent.delete(`/api/v1/invitations/${again.body.id}`).expect(204);
    assert.equal((await statusesNow())[again.body.id], 'revoked');
    await request(t.app).get(`/api/v1/invitation-links/${late}`).expect(404);
  });

  it('refuses to invite someone who is already a member', async () => {
    const { owner, member } = await orgWithMember('designer');
    const res = await owner.agent.post('/api/v1/invitations').send({ email: member.email, role: 'viewer' }).expect(409);
    assert.equal(res.body.error.code, 'already_member');
  });

  it('stores only a hash of the invitation token', async () => {
    const { token } = await orgWithMember('viewer');
    const rows = await t.db('invitations').select('*');
    assert.ok(!JSON.stringify(rows).includes(token));
  });
});

describe('owners and members', () => {
  it('never removes or demotes the last owner', async () => {
    const { owner, member } = await orgWithMember('designer');
    const demote = await owner.agent.patch(`/api/v1/members/${owner.userId}`).send({ role: 'viewer' }).expect(409);
    assert.equal(demote.body.error.code, 'last_owner');
    await owner.agent.delete(`/api/v1/members/${owner.userId}`).expect(409);

    await owner.agent.patch(`/api/v1/members/${member.userId}`).send({ role: 'owner' }).expect(200);
    await owner.agent.patch(`/api/v1/members/${owner.userId}`).send({ role: 'viewer' }).expect(200);
    const members = await member.agent.get('/api/v1/members').expect(200);
    const roles = Object.fromEntries(parseBody(memberListSchema, members).map((m) => [m.userId, m.role]));
    assert.deepEqual(roles, { [owner.userId]: 'viewer', [member.userId]: 'owner' });
    await member.agent.patch(`/api/v1/members/${member.userId}`).send({ role: 'designer' }).expect(409);
  });

  it('removes a member, whose access ends at once', async () => {
    const { owner, member } = await orgWithMember('designer');
    await member.agent.get('/api/v1/projects').expect(200);
    await owner.agent.delete(`/api/v1/members/${member.userId}`).expect(204);
    const res = await member.agent.get('/api/v1/projects').expect(403);
    assert.equal(res.body.error.code, 'no_organization');
    const session = await member.agent.get('/api/v1/session').expect(200);
    assert.equal(session.body.organizations.length, 0);
  });

  it('refuses an unknown role with a field-level message', async () => {
    const { owner, member } = await orgWithMember('viewer');
    const res = await owner.agent.patch(`/api/v1/members/${member.userId}`).send({ role: 'admin' }).expect(400);
    assert.equal(res.body.error.details[0].path, 'role');
  });
});

describe("another organisation's data answers 404", () => {
  it('cannot switch into, manage or revoke in an organisation one is not part of', async () => {
    const a = await orgWithMember('designer');
    const outsider = await signUp(t, { organizationName: 'Outsider Co' });
    await outsider.agent.put('/api/v1/session/organization').send({ organizationId: a.organizationId }).expect(404);
    // The outsider owns their own organisation; A's member and invitation are not in it.
    await outsider.agent.patch(`/api/v1/members/${a.member.userId}`).send({ role: 'viewer' }).expect(404);
    await outsider.agent.delete(`/api/v1/members/${a.member.userId}`).expect(404);
    const pending = await a.owner.agent
      .post('/api/v1/invitations')
      .send({ email: uniqueEmail(), role: 'viewer' })
      .expect(201);
    await outsider.agent.delete(`/api/v1/invitations/${pending.body.id}`).expect(404);
    const mine = await outsider.agent.get('/api/v1/members').expect(200);
    assert.deepEqual(
      parseBody(memberListSchema, mine).map((m) => m.userId),
      [outsider.userId],
    );
    const theirs = await a.owner.agent.get('/api/v1/members').expect(200);
    assert.equal(theirs.body.length, 2, 'nothing changed in the other organisation');
  });

  it('creates a further organisation and switches to it', async () => {
    const { agent } = await signUp(t, { organizationName: 'First' });
    const res = await agent.post('/api/v1/organizations').send({ name: 'Second' }).expect(201);
    const session = parseBody(sessionSchema, res);
    assert.deepEqual(
      session.organizations.map((o) => o.name),
      ['First', 'Second'],
    );
    const second = session.organizations.find((o) => o.name === 'Second');
    assert.equal(session.currentOrganizationId, second?.id);
  });
});

describe('dev outbox', () => {
  it('lists the e-mails the local sink kept, with their links', async () => {
    const owner = await signUp(t);
    const email = uniqueEmail('outbox');
    const mail = t.sink.waitFor((m) => m.to.includes(email));
    await owner.agent.post('/api/v1/invitations').send({ email, role: 'viewer' }).expect(201);
    await mail;
    const res = await request(t.app)
      .get('/api/v1/dev/outbox')
      .set('X-Dev-Outbox-Token', t.config.devOutboxToken)
      .expect(200);
    const message = parseBody(outboxMessageListSchema, res).find((m) => m.to.includes(email));
    assert.ok(message);
    assert.equal(message.links.length, 1);
    assert.match(message.links[0] ?? '', /^http:\/\/tailroom\.test\/invitations\/[A-Za-z0-9_-]{43}$/);
  });

  it('does not exist without a configured sink', async () => {
    const plain = await createTestApp({ DEV_OUTBOX_URL: '' });
    try {
      await request(plain.app).get('/api/v1/dev/outbox').expect(404);
      const session = await request(plain.app).get('/api/v1/session').expect(200);
      assert.equal(session.body.devOutbox, false);
    } finally {
      await plain.close();
    }
  });
});
