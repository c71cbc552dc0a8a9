import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { AuditLog, Organization } from '../../../server/models';
import { buildCompany, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const client = () => new ApiClient(app).init();

describe('/api/organization', () => {
  it('GET: 401, then every role reads its own company; only the owner may update', async () => {
    const { owner, crew, organization } = await buildCompany();
    expect((await (await client()).get('/api/organization')).status).toBe(401);
    const c = await (await client()).login(crew.email, TEST_PASSWORD);
    const res = await c.get('/api/organization');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: organization.id, name: organization.name, currency: 'USD', can: { update: false } });
    const o = await (await client()).login(owner.email, TEST_PASSWORD);
    expect((await o.get('/api/organization')).body.can.update).toBe(true);
  });

  it('PATCH: 401 -> 400 -> 403 -> success, with an audit row', async () => {
    const { owner, office, organization } = await buildCompany();
    expect((await (await client()).patch('/api/organization', { name: 'X Co' })).status).toBe(401);
    const o = await (await client()).login(owner.email, TEST_PASSWORD);
    const bad = await o.patch('/api/organization', { email: 'nope', timeZone: 'Mars/Olympus', currency: 'DOGE', country: 'USA' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['country', 'currency', 'email', 'timeZone']);
    const off = await (await client()).login(office.email, TEST_PASSWORD);
    expect((await off.patch('/api/organization', { name: 'Office Rename' })).status).toBe(403);
    const res = await o.patch('/api/organization', { name: 'Hilltop Tent Co', phone: '(555) 010-2030', timeZone: 'America/Denver', country: 'us' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'Hilltop Tent Co', phone: '(555) 010-2030', timeZone: 'America/Denver', country: 'US' });
    const row = (await Organization.findByPk(organization.id))!;
    expect(row.name).toBe('Hilltop Tent Co');
    const log = await AuditLog.findOne({ where: { organizationId: organization.id, action: 'organization.updated' } });
    expect(log?.data).toMatchObject({ changed: { name: { to: 'Hilltop Tent Co' } } });
  });
});

describe('errors', () => {
  it('every failure has the one JSON shape', async () => {
    const c = await client();
    const unknown = await c.get('/api/no-such-thing');
    expect(unknown.status).toBe(404);
    expect(unknown.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });

    const malformed = await c.agent.post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.code).toBe('malformed_json');

    const text = await c.agent.post('/api/auth/login').set('Content-Type', 'text/plain').send('email=a');
    expect(text.status).toBe(415);

    const huge = await c.post('/api/auth/login', { email: 'a@b.test', password: 'x'.repeat(1_100_000) });
    expect(huge.status).toBe(413);
    expect(huge.body.error.code).toBe('too_large');
  });
});
