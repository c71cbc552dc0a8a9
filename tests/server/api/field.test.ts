import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { AuditLog, Booking, BookingCrew, SiteCheck } from '../../../server/models';
import { ApiClient } from '../../support';
import { flat, pdffonts, pdfjsText, qpdfCheck } from '../documents/pdfTools';
import { as as signIn, booking, fieldCompany, keysOf, numbersOf } from './fieldCompany';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);
const anon = () => new ApiClient(app).init();

// Chicago is the companies' default zone: 14:00–18:00 UTC on 11 June 2027 is 09:00–13:00 CDT the same day.
const DAY = '2027-06-11';

describe('GET /api/field/days/:date', () => {
  it('401 -> 400 -> 403 -> the day’s deliveries and pickups with their load list totals', async () => {
    const c = await fieldCompany();
    const other = await fieldCompany();
    const office = await as(c.office);
    // Two deliveries on the day (events on the 12th) and one pickup (event on the 10th).
    const a = await booking(office, c.customer.id, '2027-06-12', [
      { itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' },
      { itemId: c.wall.id, quantity: 5, description: 'Sidewall 7x20' },
      { itemId: c.tables.id, quantity: 8, description: '8-ft banquet table' },
      { itemId: c.chairs.id, quantity: 75, description: 'White folding chair' },
      { itemId: null, quantity: 1, description: 'Delivery', kind: 'fee' },
    ], { siteNotes: 'Gate code 4411. Septic field behind the barn.' });
    const b = await booking(office, c.customer.id, '2027-06-12', [
      { itemId: c.frame.id, quantity: 2, description: '20x20 frame tent' },
      { itemId: c.chairs.id, quantity: 40, description: 'White folding chair' },
      { itemId: null, quantity: 2, description: 'Cake table skirt' },
    ], { anchoring: 'ballast', surface: 'asphalt' });
    const p = await booking(office, c.customer.id, '2027-06-10', [
      { itemId: c.frame.id, quantity: 1, description: '20x20 frame tent' },
      { itemId: c.chairs.id, quantity: 30, description: 'White folding chair' },
    ]);
    // A draft is on no day sheet; nor is another company's booking.
    await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.chairs.id, quantity: 10 }], {}, false);
    await booking(await as(other.office), other.customer.id, '2027-06-12', [{ itemId: other.chairs.id, quantity: 10 }]);

    expect((await (await anon()).get(`/api/field/days/${DAY}`)).status).toBe(401);
    const crew = await as(c.crew);
    const bad = await crew.get('/api/field/days/2027-13-45');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.date).toBeDefined();
    expect((await (await as(c.bookkeeper)).get(`/api/field/days/${DAY}`)).status).toBe(403);

    const res = await crew.get(`/api/field/days/${DAY}`);
    expect(res.status).toBe(200);
    expect(res.body.timeZone).toBe('America/Chicago');
    expect(res.body.stops.map((s: { reference: string; stop: string }) => `${s.reference} ${s.stop}`).sort()).toEqual(
      [`${a.reference} delivery`, `${b.reference} delivery`, `${p.reference} pickup`].sort(),
    );
    const stopA = res.body.stops.find((s: { reference: string }) => s.reference === a.reference);
    expect(stopA).toMatchObject({
      stop: 'delivery',
      windowStart: '2027-06-11T14:00:00.000Z',
      windowEnd: '2027-06-11T18:00:00.000Z',
      customer: { name: 'Wren Ashgrove', phone: '555-0199' },
      guestCount: 40,
      site: { address: '12 Fox Run, Millbrook, IL 60000', surface: 'grass', anchoring: 'stakes', notes: 'Gate code 4411. Septic field behind the barn.' },
      crew: [],
      mine: false,
    });
    // RFC 5870 geo URI with the address as the query.
    expect(stopA.site.mapUrl).toBe(`geo:0,0?q=${encodeURIComponent('12 Fox Run, Millbrook, IL 60000')}`);
    expect(stopA.items.map((i: { name: string }) => i.name)).not.toContain('Delivery');

    // Load list, worked by hand from the test catalog's set-up needs.
    const out = Object.fromEntries(res.body.loadList.outgoing.groups.map((g: { group: string; total: number }) => [g.group, g.total]));
    expect(out).toEqual({ tent: 3, sidewall: 5, table: 8, chair: 115, other: 2 }); // tents 1 + 2; chairs 75 + 40
    // Poles 1 x 9 + 2 x 12 = 33; stakes only where staked: 1 x 20; ballast only where weighted: 2 x 1,200 lb.
    expect(res.body.loadList.outgoing.hardware).toEqual({ poles: 33, stakes: 20, ballastLbs: 2400 });
    const back = Object.fromEntries(res.body.loadList.returning.groups.map((g: { group: string; total: number }) => [g.group, g.total]));
    expect(back).toEqual({ tent: 1, chair: 30 });
    expect(res.body.loadList.returning.hardware).toEqual({ poles: 12, stakes: 12, ballastLbs: 0 });

    // A day with nothing on it is an empty sheet, not an error.
    const empty = await crew.get('/api/field/days/2027-01-02');
    expect(empty.body).toMatchObject({ stops: [], loadList: { outgoing: { groups: [] }, returning: { groups: [] } } });
  });

  it('prints as a PDF with the stops and the load list', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' }]);
    const res = await (await as(c.crew)).agent.get(`/api/field/days/${DAY}/pdf`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (x: Buffer) => chunks.push(x));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    // Checked with tools from outside the project: qpdf, pdffonts and pdf.js.
    expect((await qpdfCheck(pdf)).code).toBe(0);
    expect((await pdffonts(pdf)).every((f) => f.emb === 'yes')).toBe(true);
    const text = flat((await pdfjsText(pdf)).pages.join(' '));
    expect(text).toContain(a.reference);
    expect(text).toContain('20x30 pole tent');
    expect(text).toMatch(/811/);
    expect(text).toMatch(/9 poles, 20 stakes/);
    expect(text).not.toMatch(/\$/);
  });
});

describe('crew assignment', () => {
  it('the office assigns people who go out on site; the crew cannot; the crew sees its own stops', async () => {
    const c = await fieldCompany();
    const other = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.chairs.id, quantity: 20 }]);
    const crew = await as(c.crew);
    expect((await crew.agent.put(`/api/field/bookings/${a.id}/crew`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send({ userIds: [c.crew.id] })).status).toBe(403);
    const put = (ids: string[]) => office.agent.put(`/api/field/bookings/${a.id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: ids });
    const bad = await put([c.bookkeeper.id, other.crew.id]);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ 'userIds.0': expect.stringMatching(/does not go out/), 'userIds.1': expect.stringMatching(/Not a person in your company/) });
    expect(await BookingCrew.count({ where: { bookingId: a.id } })).toBe(0);
    const ok = await put([c.crew.id, c.owner.id]);
    expect(ok.status).toBe(200);
    expect(ok.body.data.map((m: { id: string }) => m.id).sort()).toEqual([c.crew.id, c.owner.id].sort());
    expect(await AuditLog.count({ where: { subjectId: a.id, action: 'booking.crew_assigned' } })).toBe(1);
    const day = await crew.get(`/api/field/days/${DAY}`);
    expect(day.body.stops[0]).toMatchObject({ mine: true, crew: expect.arrayContaining([expect.objectContaining({ id: c.crew.id })]) });
    const members = await crew.get('/api/field/crew-members');
    expect(members.body.data.map((m: { role: string }) => m.role).sort()).toEqual(['crew', 'office', 'owner']);
  });
});

describe('the locate rule', () => {
  it('staking is not marked ready without a locate number or a declared hard surface with ballast, and set-up waits for it', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' }]);
    const crew = await as(c.crew);
    const put = (body: Record<string, unknown>) => crew.agent.put(`/api/field/bookings/${a.id}/site-check`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send(body);

    const bad = await put({ buildingClearanceFt: -3, privateLines: 'maybe' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['buildingClearanceFt', 'privateLines']);

    expect((await put({ locateRequested: true, privateLines: 'marked', privateLinesNotes: 'Sprinkler line along the drive.', buildingClearanceFt: 25 })).status).toBe(200);
    const notReady = await crew.post(`/api/field/bookings/${a.id}/ready-to-stake`);
    expect(notReady.status).toBe(409);
    expect(notReady.body.error.code).toBe('locate_required');
    expect(notReady.body.error.fields.locateNumber).toMatch(/811/);

    // Delivered is fine without it (and takes the booking out); set-up is not.
    const delivered = await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'delivered' });
    expect(delivered.status).toBe(200);
    expect((await Booking.findByPk(a.id))!.status).toBe('out');
    const early = await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'set_up' });
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('not_ready_to_stake');

    const withTicket = await put({ locateRequested: true, locateNumber: 'A2027-061-0042', privateLines: 'marked', buildingClearanceFt: 25 });
    expect(withTicket.body.siteCheck.readyToStake).toEqual({ ready: false, reason: null });
    const ready = await crew.post(`/api/field/bookings/${a.id}/ready-to-stake`);
    expect(ready.status).toBe(200);
    expect(ready.body.siteCheck.readyToStake.ready).toBe(true);
    expect(ready.body.delivery.progress.readyToStakeAt).not.toBeNull();
    const setUp = await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'set_up' });
    expect(setUp.status).toBe(200);
    expect(setUp.body.delivery.progress.setUpAt).not.toBeNull();

    // The ticket the tent was staked on stays on record.
    const clear = await put({ locateNumber: '' });
    expect(clear.status).toBe(409);
    expect((await SiteCheck.findOne({ where: { bookingId: a.id } }))!.locateNumber).toBe('A2027-061-0042');
  });

  it('a hard surface held with ballast is ready without a ticket; dropping the declaration before set-up takes readiness back', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.frame.id, quantity: 1, description: '20x20 frame tent' }], { surface: 'asphalt', anchoring: 'ballast' });
    const crew = await as(c.crew);
    const put = (body: Record<string, unknown>) => crew.agent.put(`/api/field/bookings/${a.id}/site-check`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send(body);
    await put({ hardSurfaceBallast: true });
    expect((await crew.post(`/api/field/bookings/${a.id}/ready-to-stake`)).status).toBe(200);
    const back = await put({ hardSurfaceBallast: false });
    expect(back.status).toBe(200);
    expect(back.body.siteCheck.readyToStake.ready).toBe(false);
    expect((await SiteCheck.findOne({ where: { bookingId: a.id } }))!.readyToStakeAt).toBeNull();
    // The database holds the rule too.
    await expect(SiteCheck.update({ readyToStakeAt: new Date() }, { where: { bookingId: a.id } })).rejects.toThrow(/site_checks_locate_rule/);
  });

  it('shows the wind limits with their Beaufort force and the tent’s occupancy and exits', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' }], { guestCount: 40, seating: 'banquet' });
    const res = await (await as(c.crew)).get(`/api/field/bookings/${a.id}`);
    expect(res.status).toBe(200);
    expect(res.body.safety.wind.occupied).toMatchObject({ mph: 30, beaufort: 6 }); // issue default 30 mph; NWS Beaufort force 6 is 25–31 mph (from memory of that table)
    expect(res.body.safety.tents[0]).toMatchObject({ areaSqFt: 600, occupantLoad: 40, exits: { count: 2, minWidthIn: 72 } }); // IFC 2018 Table 1004.5 (600/15); Table 3103.12.2
    expect(res.body.safety.cautions.some((x: { text: string }) => /811/.test(x.text))).toBe(true);

    // The owner changes the limits in Company settings; the checklist follows.
    const owner = await as(c.owner);
    const rules = (await owner.get('/api/organization/rules')).body;
    const put = await owner.agent.put('/api/organization/rules').set('X-CSRF-Token', owner.csrf).set('X-Forwarded-For', owner.ip).send({ ...rules, occupiedWindLimitMph: 35, windLimitMph: 45 });
    expect(put.status).toBe(200);
    const after = await (await as(c.crew)).get(`/api/field/bookings/${a.id}`);
    expect(after.body.safety.wind.occupied).toMatchObject({ mph: 35, beaufort: 7 }); // NWS Beaufort table: force 7 is 32–38 mph
    expect(after.body.safety.wind.takeDown).toMatchObject({ mph: 45, beaufort: 8 }); // NWS Beaufort table: force 8 is 39–46 mph (from memory of that table)
  });
});

describe('the pickup check-in', () => {
  it('counts what came back and the damage, then the booking is returned; nothing half-saved on a bad count', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [
      { itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' },
      { itemId: c.chairs.id, quantity: 50, description: 'White folding chair' },
    ]);
    const crew = await as(c.crew);
    const put = (body: Record<string, unknown>) => crew.agent.put(`/api/field/bookings/${a.id}/return-check`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send(body);
    // Not out yet: no check-in.
    expect((await put({ lines: [] })).status).toBe(403);
    await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'delivered' });

    const fresh = (await crew.get(`/api/field/bookings/${a.id}`)).body.returnCheck;
    expect(fresh.lines.map((l: { key: string; sent: number; returned: number }) => [l.key, l.sent, l.returned])).toEqual([[c.wall.id, 4, 4], [c.chairs.id, 50, 50]]);

    const bad = await put({ submit: true, lines: [{ key: c.wall.id, returned: 5, damaged: 0 }, { key: c.chairs.id, returned: 48, damaged: 49 }, { key: 'nope', returned: 1 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toMatchObject({ 'lines.0.returned': 'Only 4 went out.', 'lines.1.damaged': expect.stringMatching(/48/), 'lines.2.key': expect.any(String) });
    const noNote = await put({ submit: true, lines: [{ key: c.wall.id, returned: 4, damaged: 1 }, { key: c.chairs.id, returned: 48 }] });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.fields['lines.0.notes']).toBe('Say what is damaged.');
    expect((await Booking.findByPk(a.id))!.status).toBe('out');

    const saved = await put({ lines: [{ key: c.wall.id, returned: 4, damaged: 1, notes: 'Torn along the top seam' }] });
    expect(saved.status).toBe(200);
    expect(saved.body.returnCheck).toMatchObject({ submittedAt: null, lines: [{ key: c.wall.id, damaged: 1, notes: 'Torn along the top seam' }, { key: c.chairs.id, returned: 50 }] });
    const unfinished = await put({ submit: true, lines: [{ key: c.wall.id, returned: 4, damaged: 1, notes: 'Torn along the top seam' }] });
    expect(unfinished.status).toBe(400);
    expect(unfinished.body.error.fields.lines).toMatch(/White folding chair/);

    const done = await put({ submit: true, notes: 'Two chairs not found on site.', lines: [{ key: c.wall.id, returned: 4, damaged: 1, notes: 'Torn along the top seam' }, { key: c.chairs.id, returned: 48 }] });
    expect(done.status).toBe(200);
    expect(done.body.returnCheck.submittedAt).not.toBeNull();
    expect(done.body.returnCheck.lines[1]).toMatchObject({ sent: 50, returned: 48, missing: 2 });
    expect(done.body.can.checkIn).toBe(false);
    expect((await Booking.findByPk(a.id))!.status).toBe('returned');
    expect((await put({ submit: true, lines: [] })).status).toBe(403);
  });
});

describe('roles: the crew sees no money', () => {
  it('no field answer to the crew carries a price, an amount or a total', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [
      { itemId: c.tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' },
      { itemId: c.chairs.id, quantity: 40, unitPriceCents: 200, description: 'White folding chair' },
    ], { securityDepositCents: 25_000, setupLaborCents: 15_000 });
    await office.agent.put(`/api/field/bookings/${a.id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: [c.crew.id] });
    const crew = await as(c.crew);
    await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'delivered' });
    const answers = [
      (await crew.get(`/api/field/days/${DAY}`)).body,
      (await crew.get(`/api/field/days/2027-06-13`)).body,
      (await crew.get(`/api/field/bookings/${a.id}`)).body,
      (await crew.get(`/api/field/bookings/${a.id}/crew`)).body,
      (await crew.get('/api/field/crew-members')).body,
      (await crew.agent.put(`/api/field/bookings/${a.id}/return-check`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send({ lines: [] })).body,
    ];
    for (const body of answers) {
      expect(body.error).toBeUndefined();
      // `total` alone is a list's count; the occupant load is people and the exit width inches.
      const notMoney = ['total', 'totalOccupantLoad', 'totalWidthIn'];
      const money = [...keysOf(body)].filter((k) => !notMoney.includes(k) && /cents|price|amount|total|value|deposit|tax|invoice|payment|balance/i.test(k));
      expect(money).toEqual([]);
      // Nor any of the money figures under another name.
      for (const n of [45_000, 25_000, 15_000, 600_000, 2_400]) expect(numbersOf(body)).not.toContain(n);
    }
  });
});

describe('roles: the crew’s view of the company rules', () => {
  it('GET /api/organization/rules answers the crew the planning rules without a price, a fee or a tax; the owner and the bookkeeper still get them', async () => {
    const c = await fieldCompany();
    const owner = await as(c.owner);
    // Figures found nowhere else in the rules, so a leak under any name shows.
    const money = { taxRateBp: 712.5, depositMinCents: 12_345, damageWaiverBp: 1_357, deliveryBands: [{ upToMiles: 15, feeCents: 9_876 }] };
    const put = await owner.agent.put('/api/organization/rules').set('X-CSRF-Token', owner.csrf).set('X-Forwarded-For', owner.ip).send({ ...money, windLimitMph: 41 });
    expect(put.status, JSON.stringify(put.body)).toBe(200);

    const crew = (await (await as(c.crew)).get('/api/organization/rules')).body;
    expect(crew.error).toBeUndefined();
    // `can.seePrices` (false here) is what tells the screen the prices were left out.
    const moneyKeys = [...keysOf(crew)].filter((k) => k !== 'seePrices' && /cents|price|amount|total|value|deposit|tax|invoice|payment|balance|fee|waiver|band/i.test(k));
    expect(moneyKeys).toEqual([]);
    for (const n of [712.5, 12_345, 1_357, 9_876]) expect(numbersOf(crew)).not.toContain(n);
    // What the crew works with is all there.
    expect(crew).toMatchObject({ windLimitMph: 41, occupiedWindLimitMph: 30, turnaroundHours: 24, permitAreaSqFt: 400, sqFtPerGuest: { banquet: 8 }, can: { update: false, seePrices: false } });

    for (const who of [c.owner, c.bookkeeper]) {
      const full = (await (await as(who)).get('/api/organization/rules')).body;
      expect(full).toMatchObject({ ...money, windLimitMph: 41, can: { seePrices: true } });
    }
  });
});
