/**
 * Checks made with tools from outside the project: Debian's qpdf and poppler-utils (pdffonts)
 * and Mozilla's pdf.js (pdfjs-dist), so the engine is not graded by its own code.
 */
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);

/** The images in a PDF as poppler's pdfimages(1) lists them: page, type (image/smask), width, height, object number. */
export async function pdfImages(pdf: Buffer) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'guyline-img-'));
  const file = path.join(dir, 'document.pdf');
  fs.writeFileSync(file, pdf);
  try {
    const { stdout } = await run('/usr/bin/pdfimages', ['-list', file]);
    // Columns: page num type width height color comp bpc enc interp object ID ...
    return stdout.split('\n').slice(2).filter((l) => l.trim()).map((l) => {
      const c = l.trim().split(/\s+/);
      return { page: Number(c[0]), type: c[2], width: Number(c[3]), height: Number(c[4]), object: Number(c[10]) };
    });
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

async function withFile<T>(pdf: Buffer, fn: (file: string) => Promise<T>): Promise<T> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'guyline-pdf-'));
  const file = path.join(dir, 'document.pdf');
  fs.writeFileSync(file, pdf);
  try {
    return await fn(file);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** `qpdf --check`: exit 0 means no syntax or stream errors (qpdf(1): 2 errors, 3 warnings). */
export function qpdfCheck(pdf: Buffer): Promise<{ code: number; output: string }> {
  return withFile(pdf, async (file) => {
    try {
      const { stdout } = await run('/usr/bin/qpdf', ['--check', file]);
      return { code: 0, output: stdout };
    } catch (error) {
      const e = error as { code?: number; stdout?: string; stderr?: string };
      return { code: typeof e.code === 'number' ? e.code : -1, output: `${e.stdout ?? ''}${e.stderr ?? ''}` };
    }
  });
}

export interface FontRow {
  name: string;
  type: string;
  emb: string;
}

/** pdffonts(1) rows, read by the column positions of its header line. */
export function pdffonts(pdf: Buffer): Promise<FontRow[]> {
  return withFile(pdf, async (file) => {
    const { stdout } = await run('/usr/bin/pdffonts', [file]);
    const lines = stdout.split('\n');
    const header = lines[0];
    const typeAt = header.indexOf('type');
    const embAt = header.indexOf('emb');
    const encodingAt = header.indexOf('encoding');
    return lines
      .slice(2)
      .filter((l) => l.trim())
      .map((l) => ({ name: l.slice(0, typeAt).trim(), type: l.slice(typeAt, encodingAt).trim(), emb: l.slice(embAt, embAt + 3).trim() }));
  });
}

/** The text pdf.js extracts, one string per page, and the document info. */
export async function pdfjsText(pdf: Buffer): Promise<{ pages: string[]; info: Record<string, unknown> }> {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const task = pdfjs.getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, disableFontFace: true, verbosity: 0 });
  const doc = await task.promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    pages.push(
      content.items
        .map((item) => ('str' in item ? item.str + (item.hasEOL ? '\n' : '') : ''))
        .join('')
        .replace(/[ \t]+/g, ' '),
    );
  }
  const { info } = await doc.getMetadata();
  await task.destroy();
  return { pages, info: info as Record<string, unknown> };
}

/** Text with line breaks and runs of spaces made single spaces, for phrase searches. */
export const flat = (s: string) => s.replace(/\s+/g, ' ');
