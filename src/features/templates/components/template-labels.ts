import type { TemplateName } from '@shared/schemas/documents';

/** What each template is, in the words the list and the editor use. */
export const TEMPLATE_LABELS: Record<TemplateName, { title: string; description: string }> = {
  'rental-agreement': { title: 'Rental agreement', description: 'The agreement the customer signs: event, items, charges, payment schedule and your clauses.' },
  invoice: { title: 'Invoice', description: 'What the customer owes for the booking, with tax and the payment schedule.' },
  receipt: { title: 'Receipt', description: 'Proof of a payment received.' },
  'credit-note': { title: 'Credit note', description: 'Money given back or credited against an invoice.' },
  'email-rental-agreement': { title: 'E-mail with the rental agreement', description: 'The message that carries the rental agreement PDF.' },
  'email-invoice': { title: 'E-mail with the invoice', description: 'The message that carries the invoice PDF.' },
  'email-receipt': { title: 'E-mail with the receipt', description: 'The message that carries the receipt PDF.' },
  'email-credit-note': { title: 'E-mail with the credit note', description: 'The message that carries the credit note PDF.' },
};

export const templateTitle = (name: string) => TEMPLATE_LABELS[name as TemplateName]?.title ?? name;
