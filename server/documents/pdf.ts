/**
 * A document's Markdown laid out with pdfkit: a header on every page with the company's name
 * (and logo), headings, paragraphs with emphasis, lists, tables, the blocks of blocks.ts and a
 * "Page X of Y" footer. Only the IBM Plex Sans files from fonts/ are used, all embedded.
 *
 * pdfkit reads its own data files at run time, so it must stay outside any bundle: the server
 * runs it from TypeScript through tsx.
 */
import PDFDocument from 'pdfkit';
import { Lexer, type Token, type Tokens } from 'marked';
import { parseBlock, type InitialsBlock } from './blocks';
import { drawInitials, drawInitialsBox, drawSignatures, drawTable, ensureSpace, INITIALS_BOX, type DocumentFill, type Frame } from './pdfBlocks';
import { COLORS, FONTS, inlineRuns, plainText, writeRuns, type Run } from './pdfText';

export interface PdfInput {
  markdown: string;
  title: string;
  company: { name: string; logo?: Buffer | null };
  /** e.g. "Rental agreement B-1001 · version 2" */
  documentLabel: string;
  /** The PDF's creation date; pass the issue time so the same document gives the same bytes. */
  createdAt?: Date;
  /**
   * What the signer wrote into the boxes: initials by key and the customer's signature. The
   * filled marks are drawn inside the boxes' fixed areas, so the layout (and every page break)
   * stays exactly as issued.
   */
  fill?: DocumentFill;
  /**
   * Called once the document's pages are finished (headers and footers drawn) and before
   * doc.end(): the place to append pages of one's own (drawPageChrome gives them the same
   * header) or to add a signature placeholder.
   */
  beforeEnd?: (doc: PDFKit.PDFDocument) => void;
}

const PAGE = { size: 'LETTER' as const, top: 86, bottom: 62, side: 56 };
const BODY_SIZE = 10;

const HEADINGS: Record<number, { size: number; base: 'regular' | 'semibold'; bold: boolean; before: number; after: number }> = {
  1: { size: 19, base: 'semibold', bold: true, before: 0, after: 8 },
  2: { size: 13, base: 'semibold', bold: false, before: 14, after: 6 },
  3: { size: 11, base: 'semibold', bold: false, before: 10, after: 4 },
  4: { size: 10, base: 'semibold', bold: false, before: 8, after: 3 },
};

class Layout {
  constructor(
    private readonly doc: PDFKit.PDFDocument,
    private readonly fill: DocumentFill = {},
  ) {}

  blocks(tokens: Token[], frame: Frame, tight = false): void {
    for (let i = 0; i < tokens.length; i++) {
      const token = tokens[i];
      if (token.type === 'heading') {
        // A heading followed by an initials block gets the box beside it.
        let j = i + 1;
        while (tokens[j]?.type === 'space') j++;
        const next = tokens[j];
        const initials = next?.type === 'code' ? parseBlock((next as Tokens.Code).lang, (next as Tokens.Code).text) : null;
        if (initials?.type === 'initials') {
          this.heading(token as Tokens.Heading, frame, initials);
          i = j;
          continue;
        }
      }
      this.block(token, frame, tight);
    }
  }

  private heading(t: Tokens.Heading, frame: Frame, initials?: InitialsBlock): void {
    const doc = this.doc;
    const h = HEADINGS[Math.min(t.depth, 4)];
    const runs = inlineRuns(t.tokens).map((r) => ({ ...r, bold: r.bold || h.bold }));
    const width = initials ? frame.width - INITIALS_BOX.width - 12 : frame.width;
    doc.font(FONTS[h.base]).fontSize(h.size);
    const height = Math.max(doc.heightOfString(plainText(runs) || ' ', { width }), initials ? INITIALS_BOX.height : 0);
    doc.y += doc.y > doc.page.margins.top + 1 ? h.before : 0;
    // Keep a heading with at least three lines of what follows it.
    ensureSpace(doc, height + h.after + BODY_SIZE * 4);
    const top = doc.y;
    if (initials) {
      drawInitialsBox(doc, initials, frame.left + frame.width - INITIALS_BOX.width, top, this.fill.initials?.[initials.key]);
      // The title sits level with the middle of the box.
      doc.y = top + Math.max(0, (INITIALS_BOX.height - h.size * 1.3) / 2);
    }
    writeRuns(doc, runs, { x: frame.left, width, size: h.size, base: h.base, color: t.depth <= 2 ? COLORS.accent : COLORS.ink });
    if (initials) doc.y = Math.max(doc.y, top + INITIALS_BOX.height + 2);
    if (t.depth === 2) {
      doc
        .moveTo(frame.left, doc.y + 1)
        .lineTo(frame.left + frame.width, doc.y + 1)
        .lineWidth(0.5)
        .strokeColor(COLORS.rule)
        .stroke();
      doc.y += 3;
    }
    doc.x = frame.left;
    doc.y += h.after;
  }

  private paragraph(runs: Run[], frame: Frame, after: number, opts: { size?: number; color?: string } = {}): void {
    if (!runs.length) return;
    ensureSpace(this.doc, (opts.size ?? BODY_SIZE) * 1.5);
    writeRuns(this.doc, runs, { x: frame.left, width: frame.width, size: opts.size ?? BODY_SIZE, color: opts.color, lineGap: 2.5 });
    this.doc.x = frame.left;
    this.doc.y += after;
  }

  private block(token: Token, frame: Frame, tight: boolean): void {
    const doc = this.doc;
    switch (token.type) {
      case 'heading':
        this.heading(token as Tokens.Heading, frame);
        return;
      case 'paragraph':
        this.paragraph(inlineRuns((token as Tokens.Paragraph).tokens), frame, tight ? 2 : 7);
        return;
      case 'text': {
        const t = token as Tokens.Text;
        this.paragraph(t.tokens ? inlineRuns(t.tokens) : [{ text: t.text, bold: false, italic: false }], frame, tight ? 2 : 7);
        return;
      }
      case 'list':
        this.list(token as Tokens.List, frame);
        return;
      case 'blockquote': {
        const inner = { left: frame.left + 14, width: frame.width - 14 };
        const top = doc.y;
        this.blocks((token as Tokens.Blockquote).tokens, inner);
        if (doc.y > top) {
          doc
            .moveTo(frame.left + 3, top)
            .lineTo(frame.left + 3, doc.y - 6)
            .lineWidth(2)
            .strokeColor(COLORS.rule)
            .stroke();
        }
        return;
      }
      case 'hr':
        ensureSpace(doc, 16);
        doc
          .moveTo(frame.left, doc.y + 6)
          .lineTo(frame.left + frame.width, doc.y + 6)
          .lineWidth(0.5)
          .strokeColor(COLORS.rule)
          .stroke();
        doc.y += 14;
        return;
      case 'table':
        this.table(token as Tokens.Table, frame);
        return;
      case 'code': {
        const t = token as Tokens.Code;
        const block = parseBlock(t.lang, t.text);
        if (block?.type === 'table') drawTable(doc, block, frame);
        else if (block?.type === 'initials') drawInitials(doc, block, frame, this.fill.initials?.[block.key]);
        else if (block?.type === 'signature') drawSignatures(doc, block, frame, this.fill.signature);
        else this.paragraph([{ text: t.text, bold: false, italic: false }], { left: frame.left + 10, width: frame.width - 10 }, 7, { size: 9 });
        return;
      }
      case 'space':
      case 'html': // raw HTML is for the browser preview only
      case 'def':
        return;
      default: {
        const t = token as { tokens?: Token[]; text?: string };
        if (t.tokens) this.paragraph(inlineRuns(t.tokens), frame, 7);
        else if (t.text) this.paragraph([{ text: t.text, bold: false, italic: false }], frame, 7);
      }
    }
  }

  private list(list: Tokens.List, frame: Frame): void {
    const doc = this.doc;
    const start = typeof list.start === 'number' ? list.start : 1;
    const indent = list.ordered ? 20 : 14;
    list.items.forEach((item, i) => {
      ensureSpace(doc, BODY_SIZE * 1.6);
      const y = doc.y;
      const marker = list.ordered ? `${start + i}.` : '•';
      doc
        .font(FONTS.regular)
        .fontSize(BODY_SIZE)
        .fillColor(COLORS.ink)
        .text(marker, frame.left, y, { width: indent - 5, align: 'right', lineBreak: false });
      doc.y = y;
      this.blocks(item.tokens, { left: frame.left + indent, width: frame.width - indent }, !list.loose);
    });
    doc.x = frame.left;
    doc.y += 5;
  }

  private table(t: Tokens.Table, frame: Frame): void {
    drawTable(
      this.doc,
      {
        type: 'table',
        columns: t.header.map((cell, i) => ({ label: plainText(inlineRuns(cell.tokens)), align: t.align[i] === 'right' ? 'right' : 'left' })),
        rows: t.rows.map((row) => row.map((cell) => plainText(inlineRuns(cell.tokens)))),
        totals: [],
      },
      frame,
      'even',
    );
  }
}

/**
 * A logo larger than this (width × height, from its header) is left out of the header. pdfkit
 * decodes a PNG with transparency in JavaScript, on the event loop: an 8000 × 8000 one took 18.7 s
 * and 1 GB. Callers pass services/images.ts documentLogo(), fitted to 920 × 284 px; this keeps any
 * other caller from freezing the server.
 */
export const LOGO_MAX_PIXELS = 4_000_000;

interface OpenedImage {
  width: number;
  height: number;
}
const openedLogos = new WeakMap<PDFKit.PDFDocument, OpenedImage | null>();

/**
 * The logo opened once per document: pdfkit reads only the header to open it, and embeds an
 * opened image once however many pages show it. Null when unreadable (the name stands alone in
 * the header rather than failing the document) or over LOGO_MAX_PIXELS.
 */
function openLogo(doc: PDFKit.PDFDocument, logo: Buffer): OpenedImage | null {
  if (openedLogos.has(doc)) return openedLogos.get(doc)!;
  let opened: OpenedImage | null = null;
  try {
    const image = (doc as unknown as { openImage(src: Buffer): OpenedImage }).openImage(logo);
    opened = image.width > 0 && image.height > 0 && image.width * image.height <= LOGO_MAX_PIXELS ? image : null;
  } catch {
    opened = null;
  }
  openedLogos.set(doc, opened);
  return opened;
}

/** The frame body text is laid out in, on every page. */
export const pageFrame = (doc: PDFKit.PDFDocument): Frame => ({ left: PAGE.side, width: doc.page.width - PAGE.side * 2 });

/** The current page's header (company name and logo, document label) and a footer line of text. */
export function drawPageChrome(doc: PDFKit.PDFDocument, input: Pick<PdfInput, 'company' | 'documentLabel'>, footer: string): void {
  const left = PAGE.side;
  const width = doc.page.width - PAGE.side * 2;
  const saved = { ...doc.page.margins };
  // Writing in the margins must not start new pages.
  doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };

  let nameX = left;
  const logo = input.company.logo ? openLogo(doc, input.company.logo) : null;
  if (logo) {
    try {
      // pdfkit's image() also takes an image it has opened (its types name only sources).
      doc.image(logo as unknown as Buffer, left, 28, { fit: [110, 34], valign: 'center' });
      nameX = left + 120;
    } catch {
      // An unreadable logo leaves the name alone in the header rather than failing the document.
    }
  }
  doc
    .font(FONTS.semibold)
    .fontSize(12)
    .fillColor(COLORS.accent)
    .text(input.company.name, nameX, 38, { width: width * 0.55 - (nameX - left), lineBreak: false, ellipsis: true });
  doc
    .font(FONTS.regular)
    .fontSize(8.5)
    .fillColor(COLORS.muted)
    .text(input.documentLabel, left + width * 0.45, 41, { width: width * 0.55, align: 'right', lineBreak: false, ellipsis: true });
  doc
    .moveTo(left, 68)
    .lineTo(left + width, 68)
    .lineWidth(0.8)
    .strokeColor(COLORS.accent)
    .stroke();

  const footerY = doc.page.height - 40;
  doc
    .moveTo(left, footerY - 8)
    .lineTo(left + width, footerY - 8)
    .lineWidth(0.4)
    .strokeColor(COLORS.rule)
    .stroke();
  doc
    .font(FONTS.regular)
    .fontSize(8)
    .fillColor(COLORS.muted)
    .text(footer, left, footerY, { width, align: 'center', lineBreak: false });
  doc.page.margins = saved;
}

/** The document as PDF bytes. */
export function renderPdf(input: PdfInput): Promise<Buffer> {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.side, right: PAGE.side },
    bufferPages: true,
    // Starts pdfkit on the embedded regular face, so it never loads its default Helvetica.
    font: FONTS.regular,
    info: {
      Title: input.title,
      Author: input.company.name,
      Creator: 'Guyline',
      Producer: 'Guyline',
      CreationDate: input.createdAt ?? new Date(),
    },
    displayTitle: true,
    lang: 'en-US',
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  try {
    const frame = pageFrame(doc);
    doc.font(FONTS.regular).fontSize(BODY_SIZE).fillColor(COLORS.ink);
    new Layout(doc, input.fill).blocks(Lexer.lex(input.markdown, { gfm: true }), frame);
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      drawPageChrome(doc, input, `Page ${i - range.start + 1} of ${range.count}`);
    }
    input.beforeEnd?.(doc);
    doc.end();
  } catch (error) {
    doc.end();
    return done.then(() => Promise.reject(error));
  }
  return done;
}
