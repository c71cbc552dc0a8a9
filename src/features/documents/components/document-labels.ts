import { DOCUMENT_KIND_LABELS, PAYMENT_METHODS, type DocumentRow, type DocumentSendRow } from '@shared/schemas/documents';
import type { BadgeTone } from '@/components/ui/badge';

export const DOCUMENT_STATUS_LABELS: Record<DocumentRow['status'], string> = {
  issued: 'Current',
  replaced: 'Replaced',
  void: 'Void',
};

export const DOCUMENT_STATUS_TONES: Record<DocumentRow['status'], BadgeTone> = {
  issued: 'positive',
  replaced: 'neutral',
  void: 'negative',
};

export const PAYMENT_METHOD_LABELS: Record<(typeof PAYMENT_METHODS)[number], string> = {
  cash: 'Cash',
  check: 'Check',
  transfer: 'Bank transfer',
  card: 'Card',
};

export const paymentMethodOptions = PAYMENT_METHODS.map((value) => ({ value, label: PAYMENT_METHOD_LABELS[value] }));

export const SEND_STATUS_TONES: Record<DocumentSendRow['status'], BadgeTone> = {
  queued: 'caution',
  sent: 'positive',
  failed: 'negative',
};

/** "Rental agreement RA-0007, version 2": how a document is named in buttons and messages. */
export const documentName = (d: Pick<DocumentRow, 'kind' | 'number' | 'version'>) => `${DOCUMENT_KIND_LABELS[d.kind]} ${d.number}, version ${d.version}`;

/** The first and last characters of a SHA-256, enough to compare by eye. */
export const shortHash = (sha256: string) => (sha256.length > 16 ? `${sha256.slice(0, 8)}…${sha256.slice(-8)}` : sha256);
