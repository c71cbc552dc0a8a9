import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Customer, StoredFile, type User } from '../../../server/models';
import { buildCompany, buildCustomer, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const anon = () => new ApiClient(app).init();

// The smallest well-formed PDF header and trailer: file-type recognises PDFs by the "%PDF-" magic number.
const PDF = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n');
// A 1x1 PNG (PNG signature, IHDR, IDAT, IEND).
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082', 'hex');

const upload = (c: ApiClient, id: string, bytes: Buffer, filename: string) =>
  c.agent.post(`/api/customers/${id}/exemption-certificate`).set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', c.ip).attach('file', bytes, filename);

describe('/api/customers', () => {
  it('401 -> 400 -> 403 -> 201; search by name, e-mail and phone digits; 404 across companies', async () => {
    const { owner, office, crew, organization } = await buildCompany();
    const other = await buildCompany();
    const foreign = await buildCustomer(other.organization.id, { name: 'Far Away' });
    expect((await (await anon()).post('/api/customers', { name: 'X' })).status).toBe(401);
    const f = await as(office);
    const bad = await f.post('/api/customers', { name: '', email: 'nope', phone: 'call me' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'name', 'phone']);
    expect((await (await as(crew)).post('/api/customers', { name: 'Crew made' })).status).toBe(403);
    const created = await f.post('/api/customers', { name: 'Hollow Creek Community Church', type: 'organization', email: 'events@hollow-creek.test', phone: '(555) 014-2233', taxExempt: true });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ type: 'organization', taxExempt: true, exemptionCertificate: null, bookingCount: 0 });
    await buildCustomer(organization.id, { name: 'Avery Brindle', email: 'avery@example.test' });
    const o = await as(owner);
    expect((await o.get('/api/customers?q=hollow')).body.total).toBe(1);
    expect((await o.get('/api/customers?q=avery@')).body.data[0].name).toBe('Avery Brindle');
    expect((await o.get('/api/customers?q=555 0142')).body.data[0].name).toBe('Hollow Creek Community Church');
    expect((await o.get('/api/customers')).body.data.map((c: { name: string }) => c.name)).not.toContain('Far Away');
    expect((await o.get(`/api/customers/${foreign.id}`)).status).toBe(404);
    const put = await o.agent.put(`/api/customers/${created.body.id}`).set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ name: 'Hollow Creek Church', taxExempt: true });
    expect(put.status).toBe(200);
    expect((await Customer.findByPk(created.body.id))!.name).toBe('Hollow Creek Church');
  });

  it('takes an exemption certificate checked by content and size, serves it back, and removes it', async () => {
    const { office, bookkeeper, organization } = await buildCompany();
    const customer = await buildCustomer(organization.id, { taxExempt: true });
    const f = await as(office);
    // A text file named .pdf is refused: the type comes from the bytes, not the name.
    const fake = await upload(f, customer.id, Buffer.from('just some text pretending'), 'certificate.pdf');
    expect(fake.status).toBe(415);
    const big = await upload(f, customer.id, Buffer.concat([PDF, Buffer.alloc(5 * 1024 * 1024)]), 'big.pdf');
    expect(big.status).toBe(413);
    expect((await upload(await as(bookkeeper), customer.id, PDF, 'c.pdf')).status).toBe(403);
    expect(await StoredFile.count({ where: { organizationId: organization.id } })).toBe(0);

    const ok = await upload(f, customer.id, PDF, 'exemption 2027.pdf');
    expect(ok.status).toBe(200);
    expect(ok.body.exemptionCertificate).toMatchObject({ filename: 'exemption 2027.pdf', contentType: 'application/pdf', size: PDF.length, sha256: createHash('sha256').update(PDF).digest('hex') });
    // Replacing it keeps one file.
    const png = await upload(f, customer.id, PNG, 'scan.png');
    expect(png.body.exemptionCertificate.contentType).toBe('image/png');
    expect(await StoredFile.count({ where: { organizationId: organization.id } })).toBe(1);
    const download = await f.agent.get(`/api/customers/${customer.id}/exemption-certificate`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(download.status).toBe(200);
    expect(download.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(download.body as Buffer, PNG)).toBe(0);
    const removed = await f.delete(`/api/customers/${customer.id}/exemption-certificate`);
    expect(removed.body.exemptionCertificate).toBeNull();
    expect(await StoredFile.count({ where: { organizationId: organization.id } })).toBe(0);
  });
});
