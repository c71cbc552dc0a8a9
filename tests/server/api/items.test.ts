import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Item } from '../../../server/models';
import { buildCompany, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';
import type { User } from '../../../server/models';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const anon = () => new ApiClient(app).init();

const tent = { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 1, rentalPriceCents: 45_000, stakesPerSetup: 16 };

describe('GET /api/items', () => {
  it('401 -> 400 -> success; crew see no prices; another company sees nothing', async () => {
    const { owner, crew, organization } = await buildCompany();
    const other = await buildCompany();
    await buildItem(organization.id, { name: 'Banquet table', kind: 'table', lengthFt: 8, seats: 10, rentalPriceCents: 1000 });
    await buildItem(other.organization.id, { name: 'Foreign chair' });
    expect((await (await anon()).get('/api/items')).status).toBe(401);
    const o = await as(owner);
    expect((await o.get('/api/items?kind=spaceship')).status).toBe(400);
    const list = await o.get('/api/items?q=banquet');
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(1);
    expect(list.body.data[0]).toMatchObject({ name: 'Banquet table', rentalPriceCents: 1000, seats: 10, can: { seePrices: true, update: true } });
    const c = await (await as(crew)).get('/api/items');
    expect(c.body.data[0]).toMatchObject({ rentalPriceCents: 0, can: { seePrices: false, update: false } });
    expect(c.body.data.map((i: { name: string }) => i.name)).not.toContain('Foreign chair');
  });
});

describe('POST /api/items and PUT /api/items/:id', () => {
  it('401 -> 400 -> 403 -> 201, then 404 for another company and 409 for a taken SKU', async () => {
    const { owner, office, organization } = await buildCompany();
    const other = await buildCompany();
    expect((await (await anon()).post('/api/items', tent)).status).toBe(401);
    const o = await as(owner);
    const bad = await o.post('/api/items', { ...tent, widthFt: null, rentalPriceCents: -5, quantityOwned: -1 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['quantityOwned', 'rentalPriceCents', 'widthFt']);
    expect((await (await as(office)).post('/api/items', tent)).status).toBe(403);
    const created = await o.post('/api/items', { ...tent, sku: 'PT-2030' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ kind: 'tent', widthFt: 20, lengthFt: 30, rentalPriceCents: 45_000 });
    const foreign = await buildItem(other.organization.id);
    expect((await o.patch(`/api/items/${foreign.id}`, {})).status).toBe(404);
    expect((await o.agent.put(`/api/items/${foreign.id}`).set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ ...tent })).status).toBe(404);
    const dup = await o.post('/api/items', { ...tent, name: 'Another', sku: 'pt-2030' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.sku).toBeDefined();
    const upd = await o.agent.put(`/api/items/${created.body.id}`).set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ ...tent, sku: 'PT-2030', quantityOwned: 2 });
    expect(upd.status).toBe(200);
    expect((await Item.findByPk(created.body.id))!.quantityOwned).toBe(2);
    expect(await Item.count({ where: { organizationId: organization.id } })).toBe(1);
  });
});

describe('POST /api/items/import', () => {
  const header = 'name,kind,sku,quantity_owned,rental_price,replacement_value,taxable,tent_type,width_ft,length_ft,section_length_ft,height_ft,seats';
  const upload = (c: ApiClient, csv: string | Buffer, query = '', filename = 'stock.csv') =>
    c.agent.post(`/api/items/import${query}`).set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', c.ip).attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), filename);

  it('rejects the whole file with a row-by-row report when any row is bad; nothing is half-imported', async () => {
    const { owner, organization } = await buildCompany();
    const o = await as(owner);
    const csv = [
      header,
      '20x20 pole tent,tent,PT-1,1,350.00,3200,yes,pole,20,20,,,',
      'Sidewall,sidewall,SW-1,10,25,220,yes,,,,20,7,',
      'Broken table,table,TB-1,-3,12.345,110,maybe,,,8,,,',
      'Mystery,spaceship,X-1,1,5,0,true,,,,,,',
      'Dup sidewall,sidewall,sw-1,2,25,220,yes,,,,20,7,',
    ].join('\n');
    const res = await upload(o, csv);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('import_rejected');
    const lines = res.body.report.rejected.map((r: { line: number }) => r.line);
    expect(lines).toEqual([4, 5, 6]);
    const broken = res.body.report.rejected[0].errors;
    expect(Object.keys(broken).sort()).toEqual(['quantity_owned', 'rental_price', 'seats', 'taxable']);
    expect(res.body.report.rejected[1].errors.kind).toBeDefined();
    expect(res.body.report.rejected[2].errors.sku).toMatch(/line 3/);
    expect(await Item.count({ where: { organizationId: organization.id } })).toBe(0);
  });

  it('a dry run checks without saving; the import saves every row and converts dollars to cents exactly', async () => {
    const { owner, organization } = await buildCompany();
    const o = await as(owner);
    const csv = [header, '20x20 pole tent,tent,PT-1,1,"1,234.56",3200,yes,pole,20,20,,,', 'Chair,chair,CH-1,100,$0.29,19,no,,,,,,'].join('\r\n');
    const dry = await upload(o, csv, '?dryRun=true');
    expect(dry.status).toBe(200);
    expect(dry.body).toMatchObject({ rows: 2, created: 0, dryRun: true, rejected: [] });
    expect(await Item.count({ where: { organizationId: organization.id } })).toBe(0);
    const real = await upload(o, csv);
    expect(real.status).toBe(201);
    expect(real.body.created).toBe(2);
    const chair = await Item.findOne({ where: { organizationId: organization.id, sku: 'CH-1' } });
    // 0.29 as a float times 100 is 28.999999999999996: the parser must not go through floats.
    expect(chair!.rentalPriceCents).toBe(29);
    expect(chair!.taxable).toBe(false);
    expect((await Item.findOne({ where: { organizationId: organization.id, sku: 'PT-1' } }))!.rentalPriceCents).toBe(123_456);
  });

  it('400 for malformed CSV, 415 for a binary file or no multipart, 413 over 1 MB, 403 for the office', async () => {
    const { owner, office } = await buildCompany();
    const o = await as(owner);
    expect((await upload(o, `${header}\n"unclosed,tent`)).status).toBe(400);
    expect((await upload(o, 'colour,size\nred,1')).body.error.message).toMatch(/Unknown columns?: colour, size/);
    expect((await upload(o, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0]), '', 'x.png')).status).toBe(415);
    expect((await o.post('/api/items/import', { csv: 'a' })).status).toBe(415);
    expect((await upload(o, 'a'.repeat(1024 * 1024 + 10))).status).toBe(413);
    expect((await upload(await as(office), `${header}\n`)).status).toBe(403);
  });
});
