import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { User } from '../../../server/models';
import { buildCompany, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

describe('POST /api/planner', () => {
  it('401 -> 400 -> a tent size gives the code figures', async () => {
    const { crew } = await buildCompany();
    expect((await (await new ApiClient(app).init()).post('/api/planner', { widthFt: 20, lengthFt: 40 })).status).toBe(401);
    const c = await as(crew);
    expect((await c.post('/api/planner', { widthFt: -1 })).status).toBe(400);
    const res = await c.post('/api/planner', { widthFt: 20, lengthFt: 40 });
    expect(res.status).toBe(200);
    expect(res.body.areaSqFt).toBe(800);
    // IFC 2018 Table 1004.5: 800/7 = 114.3 -> 115; 800/5 = 160; 800/15 = 53.3 -> 54 (rounded up).
    expect(res.body.occupantLoad).toEqual({ chairsOnly: 115, standing: 160, tablesAndChairs: 54 });
    // IFC 2018 §1004.5.1: 800/7 = 114.3 -> 114 (one occupant per 7 sq ft, rounded down).
    expect(res.body.increasedLoadCap).toBe(114);
    // IFC 2018 Table 3103.12.2: 160 occupants (10-199) -> 2 exits of 72 in.
    expect(res.body.exits).toMatchObject({ count: 2, minWidthIn: 72 });
    // IFC 2018 §3103.2: over 400 sq ft needs a permit.
    expect(res.body.permitLikely).toBe(true);
    // Perimeter 120 ft / 20 ft sections = 6 (common practice, no published source).
    expect(res.body.sidewallSections).toBe(6);
    expect(res.body.cautions.map((c: { source: string }) => c.source).join(' ')).toMatch(/3103\.8\.2/);
  });

  it('recommends from the company\'s own stock, with the permit threshold from its settings', async () => {
    const { owner, organization } = await buildCompany();
    await buildItem(organization.id, { name: 'Small pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 1, rentalPriceCents: 35_000 });
    await buildItem(organization.id, { name: 'Long frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 40, quantityOwned: 1, rentalPriceCents: 85_000 });
    await buildItem(organization.id, { name: '8 ft table', kind: 'table', lengthFt: 8, seats: 10, quantityOwned: 14, rentalPriceCents: 1_000 });
    const o = await as(owner);
    const res = await o.post('/api/planner', { guests: 80, seating: 'banquet' });
    expect(res.status).toBe(200);
    // 80 guests at the default 8 sq ft a seated guest need 640 sq ft: the 20x20 (400) is too small.
    expect(res.body.recommendations.map((r: { name: string }) => r.name)).toEqual(['Long frame tent']);
    const tables = res.body.recommendations[0].lines.find((l: { name: string }) => l.name === '8 ft table');
    expect(tables.quantity).toBe(8);
    // A state that raised the permit threshold: the owner sets it.
    const rules = await o.get('/api/organization/rules');
    expect(rules.body.permitAreaSqFt).toBe(400);
    const { can: _can, ...current } = rules.body;
    const put = await o.agent.put('/api/organization/rules').set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ ...current, permitAreaSqFt: 900 });
    expect(put.status).toBe(200);
    expect((await o.post('/api/planner', { widthFt: 20, lengthFt: 40 })).body.permitLikely).toBe(false);
  });
});

describe('POST /api/quotes/preview', () => {
  it('401 -> 400 -> 403 for crew -> the breakdown, tax once per invoice', async () => {
    const { office, crew } = await buildCompany();
    const body = {
      // Three taxable $0.10 lines at 5%: rounded per line they would give 3 x $0.01 = $0.03; once on
      // the $0.30 base it is $0.015 -> $0.02 (SSUTA §324 / RCW 82.08.054: round once per invoice, half up).
      lines: [1, 2, 3].map((n) => ({ description: `Line ${n}`, quantity: 1, unitPriceCents: 10, taxable: true })),
      taxRateBp: 500,
      securityDepositCents: 10_000,
    };
    expect((await (await new ApiClient(app).init()).post('/api/quotes/preview', body)).status).toBe(401);
    const f = await as(office);
    expect((await f.post('/api/quotes/preview', { ...body, taxRateBp: -1 })).status).toBe(400);
    expect((await (await as(crew)).post('/api/quotes/preview', body)).status).toBe(403);
    const res = await f.post('/api/quotes/preview', body);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ subtotalCents: 30, taxCents: 2, totalCents: 32, securityDepositCents: 10_000, dueCents: 10_032 });
  });
});
