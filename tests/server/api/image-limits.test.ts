import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { openSigningLink } from '../../../server/commands/signing';
import { withTransaction } from '../../../server/db';
import { Booking, Document, FieldPhoto, Organization, SigningRequest, StoredFile } from '../../../server/models';
import { documentLogo } from '../../../server/services/images';
import { readFile, storeFile } from '../../../server/services/storage';
import { LOGO_MAX_BYTES } from '../../../shared/schemas/documents';
import { PHOTO_MAX_BYTES } from '../../../shared/schemas/field';
import { uniqueEmail, type ApiClient } from '../../support';
import { ApiClient as Client } from '../../support';
import { as as signIn, booking, fieldCompany } from './fieldCompany';
import { pdfImages } from '../documents/pdfTools';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);

const image = (width: number, height: number, channels: 3 | 4 = 4) =>
  sharp({ create: { width, height, channels, background: { r: 47, g: 93, b: 80, alpha: 0.6 } } });
const png = (width: number, height: number) => image(width, height).png().toBuffer();
const jpeg = (width: number, height: number) => image(width, height, 3).jpeg().toBuffer();
const sizeOf = async (bytes: Buffer) => {
  const m = await sharp(bytes).metadata();
  return [m.format, m.width, m.height];
};


// One colour compresses to almost nothing: a small file holding 64 million pixels, with
// transparency, which pdfkit would decode in JavaScript (the issue: 249 KB, 18.7 s, 1 GB).
let BIG: Buffer;
beforeAll(async () => {
  BIG = await image(8000, 8000).png({ compressionLevel: 9 }).toBuffer();
}, 60_000);

const filesOf = (organizationId: string) => StoredFile.count({ where: { organizationId } });

describe('uploaded images are measured from their header, refused when huge, and kept fitted', () => {
  it('the logo: 8000 × 8000 is a 422 naming the file and nothing is kept; PNG and JPEG logos are kept fitted to the header box', async () => {
    const c = await fieldCompany();
    const owner = await as(c.owner);
    const up = (bytes: Buffer, filename: string) =>
      owner.agent.post('/api/organization/logo').set('X-CSRF-Token', owner.csrf).set('X-Forwarded-For', owner.ip).attach('file', bytes, filename);
    // A small file: under the byte limit, so only the pixel check stops it.
    expect(BIG.length).toBeLessThan(LOGO_MAX_BYTES);
    const refused = await up(BIG, 'huge.png');
    expect(refused.status).toBe(422);
    expect(refused.body.error).toMatchObject({ code: 'image_too_large', message: expect.stringContaining('8000 × 8000'), fields: { file: expect.stringContaining('8000 × 8000') } });
    expect(await filesOf(c.organization.id)).toBe(0);
    expect((await Organization.findByPk(c.organization.id))!.logoFileId).toBeNull();

    // 3000 × 1000 inside 920 × 284: the height decides, 284 / 1000 -> 852 × 284.
    expect((await up(await png(3000, 1000), 'wide logo.png')).status).toBe(200);
    const org = (await Organization.findByPk(c.organization.id))!;
    let kept = (await readFile(org.id, org.logoFileId!))!;
    expect([kept.contentType, kept.filename, ...(await sizeOf(kept.data))]).toEqual(['image/png', 'wide logo.png', 'png', 852, 284]);
    const square = await up(await jpeg(2000, 2000), 'square.jpg');
    expect(square.status).toBe(200);
    const org2 = (await Organization.findByPk(c.organization.id))!;
    kept = (await readFile(org2.id, org2.logoFileId!))!;
    expect([kept.contentType, ...(await sizeOf(kept.data))]).toEqual(['image/jpeg', 'jpeg', 284, 284]);
    // Never enlarged; the replaced logo's file is gone.
    await up(await png(200, 100), 'small.png');
    const org3 = (await Organization.findByPk(c.organization.id))!;
    expect(await sizeOf((await readFile(org3.id, org3.logoFileId!))!.data)).toEqual(['png', 200, 100]);
    expect(await filesOf(c.organization.id)).toBe(1);
  });

  it('field photos: 8000 × 8000 is a 422 naming the file and nothing is kept; a 4000 × 3000 photo is kept as a 2560 × 1920 JPEG', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' }]);
    const crew = await as(c.crew);
    const up = (bytes: Buffer, filename: string) =>
      crew.agent.post(`/api/field/bookings/${a.id}/photos`).query({ stage: 'site' }).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).attach('file', bytes, filename);
    expect(BIG.length).toBeLessThan(PHOTO_MAX_BYTES);
    const refused = await up(BIG, 'lawn.png');
    expect(refused.status).toBe(422);
    expect(refused.body.error).toMatchObject({ code: 'image_too_large', fields: { file: expect.stringContaining('8000 × 8000') } });
    expect(await filesOf(c.organization.id)).toBe(0);
    expect(await FieldPhoto.count({ where: { bookingId: a.id } })).toBe(0);

    const ok = await up(await jpeg(4000, 3000), 'lawn.jpg');
    expect(ok.status).toBe(201);
    const kept = (await StoredFile.unscoped().findOne({ where: { organizationId: c.organization.id } }))!;
    expect([kept.contentType, ...(await sizeOf(kept.data))]).toEqual(['image/jpeg', 'jpeg', 2560, 1920]);
    expect(ok.body.photos[0]).toMatchObject({ contentType: 'image/jpeg', size: kept.data.length });
    // A PNG with transparency becomes a JPEG on white; a picture that is not one is a 400.
    const shot = await up(await png(300, 200), 'shot.png');
    expect(shot.body.photos[1]).toMatchObject({ contentType: 'image/jpeg' });
    const broken = await up(Buffer.concat([(await png(300, 200)).subarray(0, 60), Buffer.alloc(64)]), 'broken.png');
    expect(broken.status).toBe(400);
    expect(broken.body.error).toMatchObject({ code: 'image_unreadable', fields: { file: expect.any(String) } });
  });

  it('a drawn signature: 8000 × 8000 is a 422 naming signatureImage and nothing is signed; a 2400 × 800 drawing prints at 1200 × 400', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-09-18', [{ itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' }], {}, false);
    expect((await office.post(`/api/bookings/${a.id}/status`, { status: 'quoted' })).status).toBe(200);
    const issued = await office.post(`/api/bookings/${a.id}/agreement`);
    expect(issued.status).toBe(201);
    const document = (await Document.findByPk(issued.body.id))!;
    const { token } = await withTransaction((t) => openSigningLink(c.office, document, uniqueEmail('signer'), null, t));
    const signer: ApiClient = await new Client(app).init();
    expect((await signer.post(`/api/sign/${token}/consent`)).status).toBe(200);
    const page = await signer.get(`/api/sign/${token}`);
    const initials = Object.fromEntries(page.body.clauses.map((k: { key: string }) => [k.key, 'WA']));
    const dataUrl = (bytes: Buffer) => `data:image/png;base64,${bytes.toString('base64')}`;

    const refused = await signer.post(`/api/sign/${token}`, { typedName: 'Wren Ashgrove', signatureImage: dataUrl(BIG), initials });
    expect(refused.status).toBe(422);
    expect(refused.body.error).toMatchObject({ code: 'image_too_large', fields: { signatureImage: expect.stringContaining('8000 × 8000') } });
    expect((await SigningRequest.findOne({ where: { documentId: document.id } }))!.status).toBe('pending');
    expect(await Document.count({ where: { bookingId: a.id, kind: 'signed_agreement' } })).toBe(0);
    expect((await Booking.findByPk(a.id))!.status).toBe('quoted');

    const signed = await signer.post(`/api/sign/${token}`, { typedName: 'Wren Ashgrove', signatureImage: dataUrl(await png(2400, 800)), initials });
    expect(signed.status).toBe(201);
    const copy = (await Document.findByPk(signed.body.signedDocumentId))!;
    const images = await pdfImages((await readFile(copy.organizationId, copy.fileId))!.data);
    expect(images.filter((i) => i.type === 'image').map((i) => [i.width, i.height])).toEqual([[1200, 400]]);
  });

  it('a logo stored before the check: fitted for the documents when large, left off them when over the limit, drawn once per document', async () => {
    const c = await fieldCompany();
    const org = (await Organization.findByPk(c.organization.id))!;
    const storeLogo = async (data: Buffer) => {
      const file = await storeFile({ organizationId: org.id, filename: 'old-logo.png', contentType: 'image/png', data, purpose: 'logo' });
      await org.update({ logoFileId: file.id });
      return file;
    };
    await storeLogo(BIG);
    expect(await documentLogo(org)).toBeNull();
    const office = await as(c.office);
    // The day sheet with that logo answers at once, with the company's name and no picture.
    const sheet = await office.agent.get('/api/field/days/2027-06-11/pdf').set('X-Forwarded-For', office.ip).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (x: Buffer) => chunks.push(x));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(sheet.status).toBe(200);
    expect(await pdfImages(sheet.body as Buffer)).toEqual([]);

    await storeLogo(await png(3000, 1000));
    expect(await sizeOf((await documentLogo(org))!)).toEqual(['png', 852, 284]);
    const small = await png(300, 100);
    await storeLogo(small);
    expect(Buffer.compare((await documentLogo(org))!, small)).toBe(0);

    // An agreement of several pages shows the logo on each, embedded once.
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.tent.id, quantity: 1, description: '20x30 pole tent' }]);
    const issued = await office.post(`/api/bookings/${a.id}/agreement`);
    expect(issued.status).toBe(201);
    const doc = (await Document.findByPk(issued.body.id))!;
    const logos = (await pdfImages((await readFile(org.id, doc.fileId))!.data)).filter((i) => i.type === 'image');
    expect(logos.length).toBeGreaterThan(1);
    expect(new Set(logos.map((i) => i.page)).size).toBe(logos.length);
    expect(new Set(logos.map((i) => i.object)).size).toBe(1);
    expect(logos.every((i) => i.width === 300 && i.height === 100)).toBe(true);
  });
});
