import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { LOGO_MAX_PIXELS, renderPdf } from '../../../server/documents/pdf';
import { organization } from './fixtures';
import { flat, pdfImages, pdfjsText } from './pdfTools';

// Three pages of text, so the header (and its logo) is drawn three times.
const markdown = Array.from({ length: 120 }, (_, i) => `Paragraph ${i + 1}: the tent goes up on Friday and comes down on Monday.`).join('\n\n');
const render = (logo: Buffer) => renderPdf({ markdown, title: 'Logo test', company: { name: organization.name, logo }, documentLabel: 'Logo test' });

// A one-colour PNG with transparency: tiny as a file, 64 million pixels once decoded.
let huge: Buffer;
beforeAll(async () => {
  huge = await sharp({ create: { width: 8000, height: 8000, channels: 4, background: { r: 47, g: 93, b: 80, alpha: 0.6 } } }).png({ compressionLevel: 9 }).toBuffer();
}, 60_000);

describe('the logo in the PDF header', () => {
  it('a stored logo over the pixel limit is left out (the name stands alone) instead of being decoded', async () => {
    expect(8000 * 8000).toBeGreaterThan(LOGO_MAX_PIXELS);
    const pdf = await render(huge);
    expect(await pdfImages(pdf)).toEqual([]);
    const { pages } = await pdfjsText(pdf);
    expect(pages.length).toBeGreaterThan(2);
    expect(flat(pages[0])).toContain(organization.name);
  });

  it('a logo within it is embedded once and shown on every page', async () => {
    const logo = await sharp({ create: { width: 600, height: 200, channels: 4, background: { r: 47, g: 93, b: 80, alpha: 0.6 } } }).png().toBuffer();
    const images = (await pdfImages(await render(logo))).filter((i) => i.type === 'image');
    expect(images.length).toBeGreaterThan(2);
    expect(images.map((i) => i.page)).toEqual(images.map((_, n) => n + 1));
    expect(new Set(images.map((i) => i.object)).size).toBe(1);
    expect(images[0]).toMatchObject({ width: 600, height: 200 });
  });
});
