import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { AuditLog, Booking, FieldPhoto, StoredFile } from '../../../server/models';
import { buildUser } from '../../factories';
import { PHOTO_MAX_BYTES } from '../../../shared/schemas/field';
import type { ApiClient } from '../../support';
import { ApiClient as Client } from '../../support';
import { as as signIn, booking, fieldCompany } from './fieldCompany';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);

// A 1x1 PNG (PNG signature, IHDR, IDAT, IEND; PNG specification, ISO/IEC 15948).
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da6364f8cf500f00038601805a347d6b0000000049454e44ae426082', 'hex');
// The start of an ELF executable: magic 0x7F "ELF", 64-bit, little-endian (ELF specification, e_ident).
const ELF = Buffer.concat([Buffer.from('7f454c4602010100000000000000000002003e0001000000', 'hex'), Buffer.alloc(200)]);
const HTML = Buffer.from('<!DOCTYPE html><html><body><script>document.title = "owned"</script><img src=x onerror=alert(1)></body></html>');

const upload = (c: ApiClient, bookingId: string, bytes: Buffer, filename: string, fields: Record<string, string> = { stage: 'delivered' }, contentType = 'image/jpeg') => {
  return c.agent.post(`/api/field/bookings/${bookingId}/photos`).query(fields).set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', c.ip).attach('file', bytes, { filename, contentType });
};

describe('field photos', () => {
  it('401 -> 403 -> refuses a renamed executable, an HTML file, an oversized image and an empty file; keeps nothing of them', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' }]);
    const anon = await new Client(app).init();
    expect((await upload(anon, a.id, PNG, 'site.png')).status).toBe(401);
    expect((await upload(await as(c.bookkeeper), a.id, PNG, 'site.png')).status).toBe(403);

    const crew = await as(c.crew);
    // The type comes from the bytes: a program named like a photo, and a page named like one, are refused.
    const exe = await upload(crew, a.id, ELF, 'tent.jpg');
    expect(exe.status).toBe(415);
    expect(exe.body.error.fields.file).toBeDefined();
    expect((await upload(crew, a.id, HTML, 'tent.png', { stage: 'site' }, 'image/png')).status).toBe(415);
    expect((await upload(crew, a.id, HTML, 'page.html', { stage: 'site' }, 'text/html')).status).toBe(415);
    const big = await upload(crew, a.id, Buffer.concat([PNG, Buffer.alloc(PHOTO_MAX_BYTES)]), 'big.png');
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('too_large');
    const empty = await upload(crew, a.id, Buffer.alloc(0), 'empty.jpg');
    expect(empty.status).toBe(400);
    expect(empty.body.error.code).toBe('empty_file');
    // A photo needs to say what it shows.
    expect((await upload(crew, a.id, PNG, 'site.png', { stage: 'selfie' })).status).toBe(400);
    expect((await upload(crew, a.id, PNG, 'site.png', { stage: 'damage', lineKey: 'not-a-line' })).status).toBe(400);
    expect(await StoredFile.count({ where: { organizationId: c.organization.id } })).toBe(0);
    expect(await FieldPhoto.count({ where: { bookingId: a.id } })).toBe(0);
  });

  it('stores a real photo with the booking and serves it as an image that is never sniffed or run', async () => {
    const c = await fieldCompany();
    const other = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' }]);
    const crew = await as(c.crew);
    // Named .gif and sent as GIF, but it is a PNG: it is read as one, and kept (redrawn as a JPEG) and named as what it is now.
    const ok = await upload(crew, a.id, PNG, 'wall <torn>.gif', { stage: 'damage', lineKey: c.wall.id, caption: 'Torn seam' }, 'image/gif');
    expect(ok.status).toBe(201);
    const photo = ok.body.photos[0];
    const kept = (await StoredFile.unscoped().findOne({ where: { organizationId: c.organization.id } }))!;
    expect(photo).toMatchObject({ stage: 'damage', lineKey: c.wall.id, caption: 'Torn seam', contentType: 'image/jpeg', size: kept.data.length, uploadedBy: c.crew.name });
    // JPEG's start-of-image marker (ITU-T T.81, Annex B.1.1.3: 0xFFD8).
    expect(kept.data.subarray(0, 2).toString('hex')).toBe('ffd8');

    const got = await crew.agent.get(photo.url).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (x: Buffer) => chunks.push(x));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/jpeg');
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    expect(got.headers['content-security-policy']).toMatch(/default-src 'none'.*sandbox/);
    expect(got.headers['content-disposition']).toBe('inline; filename="wall _torn_.jpg"');
    expect(Buffer.compare(got.body as Buffer, kept.data)).toBe(0);
    // Another company's people do not see it.
    expect((await (await as(other.crew)).get(photo.url)).status).toBe(404);
  });

  it('a photo taken by mistake comes off (its taker or the office) until the stock is back; the file goes with it and the trail keeps its hash', async () => {
    const c = await fieldCompany();
    const other = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-19', [{ itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' }]);
    const crew = await as(c.crew);
    const mate = await as(await buildUser({ organizationId: c.organization.id, role: 'crew', name: 'Second Crew' }));
    const first = (await upload(crew, a.id, PNG, 'blurry.png', { stage: 'site', caption: 'Blurry' })).body.photos[0];
    const second = (await upload(crew, a.id, PNG, 'lawn.png', { stage: 'site', caption: 'Lawn' })).body.photos[1];
    expect([first.canRemove, second.canRemove]).toEqual([true, true]);
    // Another crew member sees them, but they are not theirs to take off; the bookkeeper is not on the field; another company cannot see them.
    expect((await mate.get(`/api/field/bookings/${a.id}`)).body.photos.map((p: { canRemove: boolean }) => p.canRemove)).toEqual([false, false]);
    expect((await mate.delete(`/api/field/photos/${first.id}`)).status).toBe(403);
    expect((await (await as(c.bookkeeper)).delete(`/api/field/photos/${first.id}`)).status).toBe(403);
    expect((await (await as(other.owner)).delete(`/api/field/photos/${first.id}`)).status).toBe(404);
    expect((await (await new Client(app).init()).delete(`/api/field/photos/${first.id}`)).status).toBe(401);

    const removed = await crew.delete(`/api/field/photos/${first.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body.photos.map((p: { id: string }) => p.id)).toEqual([second.id]);
    expect(await FieldPhoto.count({ where: { id: first.id } })).toBe(0);
    expect(await StoredFile.count({ where: { organizationId: c.organization.id } })).toBe(1);
    expect((await crew.get(first.url)).status).toBe(404);
    const trail = await AuditLog.findOne({ where: { subjectId: a.id, action: 'field.photo_removed' } });
    expect(trail?.data).toMatchObject({ photoId: first.id, stage: 'site', sha256: expect.stringMatching(/^[0-9a-f]{64}$/) });
    expect((await crew.delete(`/api/field/photos/${first.id}`)).status).toBe(404);

    // Once the stock is back and checked in, the photos are the record: nobody takes one off.
    await Booking.update({ status: 'returned' }, { where: { id: a.id } });
    expect((await office.get(`/api/field/bookings/${a.id}`)).body.photos[0].canRemove).toBe(false);
    expect((await office.delete(`/api/field/photos/${second.id}`)).status).toBe(403);
    expect(await FieldPhoto.count({ where: { id: second.id } })).toBe(1);
  });
});
