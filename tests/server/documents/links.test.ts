import { Lexer, type Token } from 'marked';
import { describe, expect, it } from 'vitest';
import { loadDefaultClauses, loadDefaultTemplate, markdownToHtml, renderDocument } from '../../../server/documents';
import { escapeMarkdown } from '../../../server/documents/template';
import { issuedAt, organization, sampleBooking, sampleValues } from './fixtures';
import { flat, pdfjsText } from './pdfTools';

/** Every link annotation pdf.js finds, page by page: what a reader can click. */
async function linkAnnotations(pdf: Buffer): Promise<{ page: number; url: string | undefined }[]> {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const task = pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, disableFontFace: true, verbosity: 0 });
  const doc = await task.promise;
  const links: { page: number; url: string | undefined }[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const annotations = (await (await doc.getPage(i)).getAnnotations()) as { subtype: string; url?: string; unsafeUrl?: string }[];
    for (const a of annotations) if (a.subtype === 'Link') links.push({ page: i, url: a.url ?? a.unsafeUrl });
  }
  await task.destroy();
  return links;
}

/** The hrefs of every link token marked makes of a Markdown text. */
function markdownLinks(markdown: string): string[] {
  const found: string[] = [];
  const walk = (tokens: Token[] | undefined) => {
    for (const t of tokens ?? []) {
      const tok = t as Token & { href?: string; tokens?: Token[]; items?: { tokens: Token[] }[] };
      if (tok.type === 'link') found.push(tok.href!);
      walk(tok.tokens);
      tok.items?.forEach((item) => walk(item.tokens));
    }
  };
  walk(Lexer.lex(markdown, { gfm: true }));
  return found;
}

// Web and e-mail addresses a customer could type into the booking's fields (the .example and
// .test names are reserved for examples and tests: RFC 2606 §2, §3).
const TYPED = {
  name: 'Evil Events https://evil.example/pay',
  email: 'billing@evil.example',
  siteLine1: 'www.x.test/directions',
  siteLine2: 'ftp://files.evil.example and HTTP://SHOUT.EXAMPLE',
};

function bookingWithAddresses() {
  const booking = sampleBooking({ customerName: TYPED.name });
  booking.customer.email = TYPED.email;
  booking.siteLine1 = TYPED.siteLine1;
  booking.siteLine2 = TYPED.siteLine2;
  booking.lines[0].description = 'Tent, see https://lines.evil.example';
  return booking;
}

describe('web addresses typed into a booking never become links in its documents', () => {
  it('escapeMarkdown stops every GFM autolink and marked reads back the same characters', () => {
    for (const value of [...Object.values(TYPED), 'mailto:a@b.test', 'xmpp:chat@evil.example', 'WWW.upper.test', 'see <https://angle.example>', '[click](https://md.example)']) {
      const escaped = escapeMarkdown(value);
      // Without the escape GFM links the bare ones: the check would fail on them.
      expect(markdownLinks(escaped), value).toEqual([]);
      const text = Lexer.lex(escaped, { gfm: true })[0] as Token & { text: string; tokens?: Token[] };
      const shown = (text.tokens ?? []).map((t) => (t as { text?: string }).text ?? '').join('');
      expect(shown.replace(/&lt;/g, '<').replace(/&gt;/g, '>'), value).toBe(value);
    }
    // The check itself sees links: the same values unescaped are links.
    expect(markdownLinks('https://evil.example www.x.test billing@evil.example').length).toBe(3);
  });

  it('the default rental agreement with addresses in the name, e-mail, site and lines: printed, but no link annotation', async () => {
    const values = sampleValues('rental_agreement', bookingWithAddresses());
    const doc = await renderDocument({ template: loadDefaultTemplate('rental_agreement'), clauses: loadDefaultClauses(), values, company: { name: organization.name }, issuedAt });
    const text = flat((await pdfjsText(doc.pdf)).pages.join('\n'));
    expect(text).toContain(TYPED.name);
    expect(text).toContain(TYPED.email);
    expect(text).toContain(TYPED.siteLine1);
    expect(await linkAnnotations(doc.pdf)).toEqual([]);
    expect(doc.pdf.includes('/URI')).toBe(false);
    // The preview the signer reads: no anchor either.
    expect(doc.html).not.toMatch(/<a\b/i);
    expect(markdownToHtml(doc.markdown)).toContain('https://evil.example/pay');
  });

  it("the company's own template text keeps its link; the values beside it stay text", async () => {
    const template = [
      '# Agreement for {{customer.name}}',
      '',
      'Write to {{customer.email}}. Site: {{booking.siteAddress}}.',
      '',
      'Our terms are at [our terms page](https://terms.example/rental).',
    ].join('\n');
    const values = sampleValues('rental_agreement', bookingWithAddresses());
    const doc = await renderDocument({ template, clauses: [], values, company: { name: organization.name }, issuedAt });
    expect(await linkAnnotations(doc.pdf)).toEqual([{ page: 1, url: 'https://terms.example/rental' }]);
    expect(doc.html.match(/<a\b[^>]*href="[^"]*"/g)).toEqual(['<a href="https://terms.example/rental"']);
  });
});
