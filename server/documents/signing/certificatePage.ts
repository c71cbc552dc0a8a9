/**
 * The certificate page appended to a signed document: what was signed (the issued document and
 * its SHA-256), by whom, the audit trail with time, IP address and user agent, and the company
 * certificate the PDF is digitally signed with. It may run over several pages for a long trail.
 */
import { drawPageChrome, pageFrame } from '../pdf';
import { ensureSpace, SIGNATURE_INK } from '../pdfBlocks';
import { COLORS, FONTS } from '../pdfText';

export interface TrailEvent {
  at: Date;
  event: string;
  ip: string;
  userAgent: string;
  detail?: string;
}

export interface CertificatePageInput {
  company: { name: string; logo?: Buffer | null };
  title: string;
  documentLabel: string;
  issuedAt: Date;
  issuedSha256: string;
  issuedPageCount: number;
  signer: { typedName: string; signedAt: Date; drawn: boolean };
  initials: { key: string; heading?: string; initials: string }[];
  trail: TrailEvent[];
  fingerprintSha256: string;
}

const LABEL_WIDTH = 150;

export const utc = (d: Date) => d.toISOString();

export function drawCertificatePages(doc: PDFKit.PDFDocument, input: CertificatePageInput): void {
  const frame = pageFrame(doc);
  const firstPage = doc.bufferedPageRange().start + doc.bufferedPageRange().count;
  doc.addPage();

  const heading = (text: string, size: number, before: number) => {
    ensureSpace(doc, size * 1.4 + 40);
    doc.y += doc.y > doc.page.margins.top + 1 ? before : 0;
    doc.font(FONTS.semibold).fontSize(size).fillColor(COLORS.accent).text(text, frame.left, doc.y, { width: frame.width });
    doc.y += 4;
  };
  const paragraph = (text: string, opts: { color?: string; size?: number } = {}) => {
    doc.font(FONTS.regular).fontSize(opts.size ?? 9.5);
    ensureSpace(doc, Math.min(doc.heightOfString(text, { width: frame.width, lineGap: 2 }), 60));
    doc.fillColor(opts.color ?? COLORS.ink).text(text, frame.left, doc.y, { width: frame.width, lineGap: 2 });
    doc.y += 6;
  };
  const row = (label: string, value: string, opts: { ink?: string; font?: string } = {}) => {
    const width = frame.width - LABEL_WIDTH;
    doc.font(FONTS.regular).fontSize(8.5);
    const labelHeight = doc.heightOfString(label, { width: LABEL_WIDTH - 10 });
    doc.font(opts.font ?? FONTS.regular).fontSize(9.5);
    const height = Math.max(doc.heightOfString(value || ' ', { width, lineGap: 1.5 }), labelHeight, 12);
    ensureSpace(doc, height + 4);
    const y = doc.y;
    doc.font(FONTS.regular).fontSize(8.5).fillColor(COLORS.muted).text(label, frame.left, y + 1, { width: LABEL_WIDTH - 10 });
    doc
      .font(opts.font ?? FONTS.regular)
      .fontSize(9.5)
      .fillColor(opts.ink ?? COLORS.ink)
      .text(value, frame.left + LABEL_WIDTH, y, { width, lineGap: 1.5 });
    doc.y = Math.max(doc.y, y + height) + 4;
  };

  heading('Signing certificate', 19, 0);
  paragraph(
    `This page is part of ${input.documentLabel}. It records how the document was signed electronically ` +
      'and how anyone can check that it has not been changed since.',
    { color: COLORS.muted },
  );

  heading('The document', 12, 10);
  row('Document', input.documentLabel);
  row('Title', input.title);
  row('Issued (UTC)', utc(input.issuedAt));
  row('Pages as issued', `${input.issuedPageCount}, followed by this certificate`);
  row('SHA-256 of the issued PDF', input.issuedSha256);

  heading('The signature', 12, 10);
  row('Signed by (typed name)', input.signer.typedName, { ink: SIGNATURE_INK });
  row('Signed at (UTC)', utc(input.signer.signedAt));
  row('Signature', input.signer.drawn ? 'Drawn by the signer on the signing page' : 'Typed name, shown in a signature style');
  for (const i of input.initials) row('Initials', `${i.initials}   beside ${i.heading ?? `the box "${i.key}"`}`, { ink: SIGNATURE_INK });

  heading('Digital signature', 12, 10);
  paragraph(
    `This PDF is digitally signed with ${input.company.name}'s own certificate, whose SHA-256 fingerprint is:`,
  );
  paragraph(input.fingerprintSha256, { size: 9 });
  paragraph(
    'The signature covers every byte of this file, so any later change, however small, is detectable: a PDF reader ' +
      "shows the signature as broken, and the company's records can be checked against the SHA-256 values on this page.",
  );

  heading('Audit trail', 12, 10);
  paragraph('Times are UTC. IP addresses and browsers (user agents) are as the server recorded them for each request.', {
    color: COLORS.muted,
    size: 8.5,
  });
  for (const e of input.trail) {
    const head = `${utc(e.at)}   ${e.event}${e.detail ? ` (${e.detail})` : ''}`;
    const sub = `IP address ${e.ip}   ·   ${e.userAgent || 'no user agent sent'}`;
    doc.font(FONTS.semibold).fontSize(9.5);
    const h1 = doc.heightOfString(head, { width: frame.width });
    doc.font(FONTS.regular).fontSize(8.5);
    const h2 = doc.heightOfString(sub, { width: frame.width - 12, lineGap: 1 });
    ensureSpace(doc, h1 + h2 + 8);
    doc.font(FONTS.semibold).fontSize(9.5).fillColor(COLORS.ink).text(head, frame.left, doc.y, { width: frame.width });
    doc.font(FONTS.regular).fontSize(8.5).fillColor(COLORS.muted).text(sub, frame.left + 12, doc.y, { width: frame.width - 12, lineGap: 1 });
    doc.y += 6;
  }

  const range = doc.bufferedPageRange();
  const count = range.start + range.count - firstPage;
  for (let i = firstPage; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    drawPageChrome(doc, input, `Signing certificate, page ${i - firstPage + 1} of ${count}`);
  }
  doc.fillColor(COLORS.ink);
}
