import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { AuditLog, User } from '../../../server/models';
import { buildCompany, buildUser, TEST_PASSWORD } from '../../factories';
import { ApiClient, linkToken, mailTo, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const client = () => new ApiClient(app).init();
const as = async (user: User) => (await client()).login(user.email, TEST_PASSWORD);

describe('GET /api/users', () => {
  it('401 -> 400 -> 403 -> success, scoped to the company', async () => {
    const { owner, office, organization } = await buildCompany();
    const stranger = await buildUser();
    expect((await (await client()).get('/api/users')).status).toBe(401);
    const o = await as(owner);
    const bad = await o.get('/api/users?page=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.page).toBeDefined();
    expect((await (await as(office)).get('/api/users')).status).toBe(403);
    const res = await o.get('/api/users?pageSize=2');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(4);
    expect(res.body.data).toHaveLength(2);
    const all = await o.get('/api/users');
    expect(all.body.data.map((u: { id: string }) => u.id)).not.toContain(stranger.id);
    for (const row of all.body.data) {
      expect(Object.keys(row).sort()).toEqual(['can', 'createdAt', 'email', 'id', 'lastSignInAt', 'name', 'role', 'status']);
    }
    expect(await User.count({ where: { organizationId: organization.id } })).toBe(4);
  });
});

describe('POST /api/users/invite and accepting an invitation', () => {
  it('401 -> 400 -> 403 -> 409 -> 201, then the invitee sets a password and signs in', async () => {
    const { owner, crew } = await buildCompany();
    expect((await (await client()).post('/api/users/invite', {})).status).toBe(401);
    const o = await as(owner);
    const bad = await o.post('/api/users/invite', { email: 'nope', name: '', role: 'captain' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'name', 'role']);
    expect((await (await as(crew)).post('/api/users/invite', { email: uniqueEmail(), name: 'X', role: 'crew' })).status).toBe(403);
    expect((await o.post('/api/users/invite', { email: crew.email, name: 'Dup', role: 'crew' })).status).toBe(409);

    const email = uniqueEmail('invitee');
    const res = await o.post('/api/users/invite', { email, name: 'Rowan Birch', role: 'office' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, role: 'office', status: 'invited', can: { resendInvite: true } });

    const mail = await waitForMail(email, { subject: /invited you/ });
    const token = linkToken(mail, '/invite');
    const visitor = await client();
    const preview = await visitor.get(`/api/auth/invites/${token}`);
    expect(preview.body).toMatchObject({ email, role: 'office', name: 'Rowan Birch' });
    expect((await visitor.post('/api/auth/invites/accept', { token, password: 'short' })).status).toBe(400);
    const accepted = await visitor.post('/api/auth/invites/accept', { token, password: 'my-own-password', name: 'Rowan B.' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email, role: 'office', name: 'Rowan B.' });
    expect((await visitor.get('/api/auth/me')).status).toBe(200);
    // The link works once.
    expect((await (await client()).post('/api/auth/invites/accept', { token, password: 'my-own-password' })).body.error.code).toBe('invalid_token');
    expect(await AuditLog.count({ where: { organizationId: owner.organizationId, action: 'user.joined' } })).toBe(1);
  });

  it('resending an invitation replaces the old link', async () => {
    const { owner } = await buildCompany();
    const o = await as(owner);
    const email = uniqueEmail('resend');
    const { body } = await o.post('/api/users/invite', { email, name: 'Kit Fenn', role: 'crew' });
    const first = linkToken(await waitForMail(email), '/invite');
    expect((await o.post(`/api/users/${body.id}/resend-invite`)).status).toBe(202);
    await waitForMail(email, { count: 2 });
    const [latest] = await mailTo(email);
    const second = linkToken(latest, '/invite');
    expect(second).not.toBe(first);
    expect((await (await client()).get(`/api/auth/invites/${first}`)).status).toBe(400);
    expect((await (await client()).get(`/api/auth/invites/${second}`)).status).toBe(200);
  });
});

describe('PATCH /api/users/:id', () => {
  it('401 -> 400 -> 403 -> 404 -> success', async () => {
    const { owner, office, crew } = await buildCompany();
    const stranger = await buildUser({ role: 'crew' });
    expect((await (await client()).patch(`/api/users/${crew.id}`, { role: 'office' })).status).toBe(401);
    const o = await as(owner);
    expect((await o.patch(`/api/users/${crew.id}`, { role: 'boss' })).status).toBe(400);
    expect((await o.patch(`/api/users/${crew.id}`, {})).status).toBe(400);
    expect((await o.patch('/api/users/not-a-uuid', { role: 'office' })).status).toBe(400);
    expect((await (await as(office)).patch(`/api/users/${crew.id}`, { role: 'office' })).status).toBe(403);
    // Another company's user is missing, not forbidden.
    const other = await o.patch(`/api/users/${stranger.id}`, { role: 'office' });
    expect(other.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
    const res = await o.patch(`/api/users/${crew.id}`, { role: 'office' });
    expect(res.status).toBe(200);
    expect(res.body.role).toBe('office');
    expect((await User.findByPk(stranger.id))!.role).toBe('crew');
  });

  it('409 when it would leave the company without an active owner', async () => {
    const { owner } = await buildCompany();
    const o = await as(owner);
    const res = await o.patch(`/api/users/${owner.id}`, { role: 'office' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('last_owner');
    expect((await User.findByPk(owner.id))!.role).toBe('owner');
    // With a second owner it is allowed.
    const second = await buildUser({ organizationId: owner.organizationId, role: 'owner' });
    expect((await o.patch(`/api/users/${second.id}`, { role: 'bookkeeper' })).status).toBe(200);
    expect((await o.patch(`/api/users/${owner.id}`, { disabled: true })).status).toBe(403);
  });
});
