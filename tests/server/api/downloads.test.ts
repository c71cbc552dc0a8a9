import net from 'node:net';
import type { AddressInfo } from 'node:net';
import { parse } from 'content-disposition';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { StoredFile } from '../../../server/models';
import { contentDisposition } from '../../../server/services/downloads';
import { buildCustomer, TEST_PASSWORD } from '../../factories';
import { uniqueIp, type ApiClient } from '../../support';
import { as as signIn, booking, fieldCompany } from './fieldCompany';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);

// The smallest well-formed PDF header and trailer (file-type knows a PDF by "%PDF-").
const PDF = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n');
// A 1x1 PNG with transparency (PNG specification, ISO/IEC 15948: signature, IHDR, IDAT, IEND).
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da6364f8cf500f00038601805a347d6b0000000049454e44ae426082', 'hex');

// U+010D and U+010A: Node writes a header string as Latin-1, one byte per character, so put in a
// header raw they would go out as their low bytes, CR (0x0D) and LF (0x0A): a header line and a
// body of the name's choosing. No "/" in it: a form's file name keeps only what follows the last one.
const PLANTED = 'cert\u010D\u010AX-Injected: yes\u010D\u010A\u010D\u010A<b>owned<b>';

/** A whole response as it crossed the wire: the status line, each header line, the body's bytes. */
async function rawGet(port: number, path: string, cookie: string) {
  const socket = net.connect(port, '127.0.0.1');
  await new Promise((resolve, reject) => socket.once('connect', resolve).once('error', reject));
  // Written, not ended: the server closes the connection after its answer (Connection: close).
  socket.write(`GET ${path} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nCookie: ${cookie}\r\nX-Forwarded-For: ${uniqueIp()}\r\nConnection: close\r\n\r\n`);
  const chunks: Buffer[] = [];
  for await (const chunk of socket) chunks.push(chunk as Buffer);
  const all = Buffer.concat(chunks);
  const end = all.indexOf('\r\n\r\n');
  const lines = all.subarray(0, end).toString('latin1').split('\r\n');
  return { status: lines[0], headers: lines.slice(1), body: all.subarray(end + 4) };
}

/** The checks every download answer passes: ASCII header lines only, nothing planted, the body as stored. */
function expectClean(res: Awaited<ReturnType<typeof rawGet>>, stored: Buffer, name: string, type: 'inline' | 'attachment') {
  expect(res.status).toBe('HTTP/1.1 200 OK');
  for (const line of res.headers) expect(line, 'a header line of printable ASCII').toMatch(/^[A-Za-z0-9-]+: [\x20-\x7e]*$/);
  expect(res.headers.filter((l) => /^x-injected/i.test(l))).toEqual([]);
  const dispositions = res.headers.filter((l) => /^content-disposition:/i.test(l));
  expect(dispositions).toHaveLength(1);
  const value = dispositions[0].slice(dispositions[0].indexOf(':') + 2);
  expect(value).toBe(contentDisposition(name, type));
  // What a browser reads back (RFC 6266 §4.3: filename* wins): the whole name, control characters made "_".
  const parsed = parse(value);
  expect(parsed.type).toBe(type);
  expect(parsed.parameters.filename).toBe(name.replace(/[\u0000-\u001f\u007f-\u009f]/g, '_'));
  const length = res.headers.find((l) => /^content-length:/i.test(l));
  expect(Number(length?.split(': ')[1])).toBe(stored.length);
  expect(Buffer.compare(res.body, stored)).toBe(0);
}

let server: ReturnType<typeof app.listen>;
let port: number;
beforeAll(async () => {
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});
afterAll(() => new Promise((r) => server.close(r)));

async function cookieOf(email: string) {
  const login = await fetch(`http://127.0.0.1:${port}/api/auth/login`, {
    method: 'POST', headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': uniqueIp() }, body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  expect(login.status).toBe(200);
  return login.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

describe('download names', () => {
  it('one header form: plain ASCII filename= and, for any other name, RFC 6266 filename*=UTF-8', () => {
    const cases: [string, string][] = [
      ['exemption 2027.pdf', 'attachment; filename="exemption 2027.pdf"'],
      ['Čelo ľudí.pdf', `attachment; filename="Celo ludi.pdf"; filename*=UTF-8''%C4%8Celo%20%C4%BEud%C3%AD.pdf`],
      ['報告.pdf', `attachment; filename="__.pdf"; filename*=UTF-8''%E5%A0%B1%E5%91%8A.pdf`],
      ['🎪 tent.png', `attachment; filename="_ tent.png"; filename*=UTF-8''%F0%9F%8E%AA%20tent.png`],
      ['a"b\\c%41.pdf', `attachment; filename="a_b_c_41.pdf"; filename*=UTF-8''a%22b%5Cc%2541.pdf`],
      ['x\r\nSet-Cookie: a=b.pdf', 'attachment; filename="x__Set-Cookie: a=b.pdf"'],
      ['invoice\u202Efdp.exe', 'attachment; filename="invoice_fdp.exe"'],
      [PLANTED, `attachment; filename="certcCX-Injected: yescCcC<b>owned<b>"; filename*=UTF-8''cert%C4%8D%C4%8AX-Injected%3A%20yes%C4%8D%C4%8A%C4%8D%C4%8A%3Cb%3Eowned%3Cb%3E`],
      ['', 'attachment; filename="download"'],
    ];
    for (const [name, header] of cases) {
      expect(contentDisposition(name), JSON.stringify(name)).toBe(header);
      expect(header).toMatch(/^[\x20-\x7e]+$/);
    }
    expect(contentDisposition('stops.ics', 'inline')).toBe('inline; filename="stops.ics"');
  });

  it('a certificate uploaded under a name with U+010D and U+010A downloads with its own headers and bytes, nothing planted (raw HTTP)', async () => {
    const c = await fieldCompany();
    const customer = await buildCustomer(c.organization.id, { taxExempt: true });
    const office = await as(c.office);
    const name = `${PLANTED}.pdf`;
    const up = await office.agent
      .post(`/api/customers/${customer.id}/exemption-certificate`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip)
      .attach('file', PDF, { filename: name, contentType: 'application/pdf' });
    expect(up.status).toBe(200);
    // The form's name is read as the UTF-8 a browser sends, so the stored name is the one typed.
    expect(up.body.exemptionCertificate.filename).toBe(name);
    const res = await rawGet(port, `/api/customers/${customer.id}/exemption-certificate`, await cookieOf(c.office.email));
    expectClean(res, PDF, name, 'attachment');
  });

  it('a photo whose stored name holds them, and a name with C1 controls, downloads the same way (raw HTTP)', async () => {
    const c = await fieldCompany();
    const office: ApiClient = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' }]);
    const up = await office.agent
      .post(`/api/field/bookings/${a.id}/photos`).query({ stage: 'site' }).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip)
      .attach('file', PNG, { filename: 'site.png', contentType: 'image/png' });
    expect(up.status).toBe(201);
    const photo = up.body.photos[0];
    const file = (await StoredFile.unscoped().findOne({ where: { organizationId: c.organization.id, purpose: 'field_photo' } }))!;
    const cookie = await cookieOf(c.office.email);
    // A name stored by any older path, not only by today's upload.
    for (const name of [`${PLANTED}.jpg`, 'lawn\u0085\u008dX-Injected: 1.jpg']) {
      await StoredFile.update({ filename: name }, { where: { id: file.id } });
      expectClean(await rawGet(port, photo.url, cookie), file.data, name, 'inline');
    }
  });
});
