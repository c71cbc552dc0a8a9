/**
 * Every image a person sends in (the company's logo, field photos, a drawn signature) passes
 * here before it is kept or drawn: its width and height are read from the file's header, an
 * image over the purpose's pixel limit is refused without being decoded, and the rest is decoded
 * once and written again, fitted inside the size it is used at (EXIF orientation applied, the
 * metadata dropped).
 *
 * Why: a small file can hold a huge picture. A 249 KB PNG of 8000 × 8000 pixels took 18.7 s of
 * CPU and 1 GB of memory to draw once in a PDF (pdfkit decodes PNG transparency in JavaScript on
 * the event loop), and every document and day sheet draws the logo. sharp (libvips) works in
 * libuv's thread pool, so decoding here never holds the request thread.
 */
import sharp, { type Metadata } from 'sharp';
import { HttpError } from '../errors';
import { logger } from '../logger';
import { readFile } from './storage';

export type ImagePurpose = 'logo' | 'photo' | 'signature';

interface ImageRule {
  /** Width × height above which the image is refused, read from its header. */
  maxPixels: number;
  /** The box the kept copy fits inside, in pixels; never enlarged. */
  box: { width: number; height: number };
  /** What it is called in messages. */
  what: string;
  /** What the person does about a refusal. */
  fix: string;
}

export const IMAGE_RULES: Record<ImagePurpose, ImageRule> = {
  // The header's logo box is 110 × 34 pt (documents/pdf.ts, drawPageChrome): 917 × 283 px at
  // 600 dpi (1 pt = 1/72 in, PDF 1.7, ISO 32000-1 §8.3.2.3). A logo file larger than 25
  // megapixels is an export mistake (common practice, no published source).
  logo: { maxPixels: 25_000_000, box: { width: 920, height: 284 }, what: 'logo', fix: 'Save it smaller (a few hundred pixels is plenty) and upload it again.' },
  // Phone cameras take 12 to 50 megapixels (common practice, no published source); 2560 px on the
  // long side keeps a damage photo readable when zoomed on a screen.
  photo: { maxPixels: 50_000_000, box: { width: 2560, height: 2560 }, what: 'photo', fix: 'Take it at the camera’s normal size, or shrink it, and upload it again.' },
  // The pad is a canvas at the screen's pixel ratio: at most 4000 px a side (documents/signing,
  // checkSignaturePng). The mark prints in a box about 234 × 40 pt: 1200 × 400 px is over 300 dpi.
  signature: { maxPixels: 16_000_000, box: { width: 1200, height: 400 }, what: 'drawn signature', fix: 'Clear it and draw again.' },
};

export interface KeptImage {
  data: Buffer;
  contentType: 'image/png' | 'image/jpeg';
  ext: 'png' | 'jpg';
  width: number;
  height: number;
}

const megapixels = (n: number) => `${Math.round(n / 100_000) / 10}`;

function unreadable(rule: ImageRule, field: string) {
  return new HttpError(400, 'image_unreadable', `The ${rule.what} could not be read as an image. ${rule.fix}`, { [field]: 'Could not be read as an image.' });
}

/** Width and height from the header: libvips opens the file lazily, so no pixel is decoded. */
async function headerSize(data: Buffer, rule: ImageRule, field: string) {
  let meta: Metadata;
  try {
    meta = await sharp(data, { limitInputPixels: false }).metadata();
  } catch {
    throw unreadable(rule, field);
  }
  if (!meta.width || !meta.height) throw unreadable(rule, field);
  return { width: meta.width, height: meta.height, format: meta.format, hasAlpha: meta.hasAlpha };
}

function refuseOversized(size: { width: number; height: number }, rule: ImageRule, field: string): void {
  if (size.width * size.height <= rule.maxPixels) return;
  throw new HttpError(
    422,
    'image_too_large',
    `The ${rule.what} is ${size.width} × ${size.height} pixels (${megapixels(size.width * size.height)} megapixels); the most taken is ${megapixels(rule.maxPixels)} megapixels. ${rule.fix}`,
    { [field]: `${size.width} × ${size.height} pixels: at most ${megapixels(rule.maxPixels)} megapixels.` },
  );
}

/**
 * The copy to keep of an uploaded image: refused (422 `image_too_large`, naming `field`) when its
 * header says it is over the purpose's pixel limit, 400 `image_unreadable` when it cannot be read;
 * otherwise decoded once and fitted inside the purpose's box. Logos keep PNG (transparency) or
 * JPEG; photos become JPEG; signatures stay PNG.
 */
export async function keptImage(data: Buffer, purpose: ImagePurpose, field = 'file'): Promise<KeptImage> {
  const rule = IMAGE_RULES[purpose];
  const size = await headerSize(data, rule, field);
  refuseOversized(size, rule, field);
  const asPng = purpose === 'signature' || (purpose === 'logo' && size.format !== 'jpeg');
  // limitInputPixels again: the decoder itself stops at the limit, whatever the header said.
  let image = sharp(data, { limitInputPixels: rule.maxPixels, failOn: 'error', sequentialRead: true })
    .rotate()
    .resize({ width: rule.box.width, height: rule.box.height, fit: 'inside', withoutEnlargement: true });
  image = asPng ? image.png() : image.flatten({ background: '#ffffff' }).jpeg({ quality: purpose === 'photo' ? 85 : 90 });
  try {
    const { data: out, info } = await image.toBuffer({ resolveWithObject: true });
    return { data: out, contentType: asPng ? 'image/png' : 'image/jpeg', ext: asPng ? 'png' : 'jpg', width: info.width, height: info.height };
  } catch {
    throw unreadable(rule, field);
  }
}

// Stored files never change (a new logo is a new file), so a fitted copy is good for as long as
// the process runs. A few dozen companies' logos, each a few kilobytes.
const fittedLogos = new Map<string, Buffer | null>();
const FITTED_LOGOS_KEPT = 64;

/**
 * The company's logo as the documents draw it. Uploads are fitted already; a logo stored before
 * that was checked may be anything, so it is fitted here (in the thread pool) when larger than the
 * header box, and left out (with a warning in the log) when over the upload limit or unreadable.
 */
export async function documentLogo(organization: { id: string; logoFileId?: string | null }): Promise<Buffer | null> {
  if (!organization.logoFileId) return null;
  const key = `${organization.id}/${organization.logoFileId}`;
  if (fittedLogos.has(key)) return fittedLogos.get(key)!;
  const file = await readFile(organization.id, organization.logoFileId);
  if (!file) return null;
  const rule = IMAGE_RULES.logo;
  let logo: Buffer | null = null;
  try {
    const size = await headerSize(file.data, rule, 'logo');
    logo = size.width <= rule.box.width && size.height <= rule.box.height ? file.data : (await keptImage(file.data, 'logo', 'logo')).data;
  } catch (err) {
    logger.warn({ organizationId: organization.id, fileId: organization.logoFileId, reason: (err as Error).message }, 'stored logo left off the documents');
  }
  if (fittedLogos.size >= FITTED_LOGOS_KEPT) fittedLogos.delete(fittedLogos.keys().next().value!);
  fittedLogos.set(key, logo);
  return logo;
}
