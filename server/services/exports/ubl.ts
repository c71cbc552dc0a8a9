import { create } from 'xmlbuilder2';
import type { XMLBuilder } from 'xmlbuilder2/lib/interfaces';
import { INVOICE_KIND_LABELS, type InvoiceKind, type InvoiceLineRow } from '../../../shared/schemas/invoices';
import type { TextRow } from './csv';
import { centsText } from './format';

/**
 * Paid invoices as OASIS UBL 2.1 documents (http://docs.oasis-open.org/ubl/os-UBL-2.1/): an
 * Invoice, or a CreditNote for a credit note. Elements are written in the order of the UBL 2.1
 * schemas (xsd/maindoc/UBL-Invoice-2.1.xsd and UBL-CreditNote-2.1.xsd, and the aggregate types in
 * xsd/common/UBL-CommonAggregateComponents-2.1.xsd); only elements Guyline has true values for
 * are written. Sales tax is one amount per invoice (TaxTotal/TaxAmount): the taxable base of each
 * rate is not stored, and a TaxSubtotal would require it (TaxableAmount is mandatory there).
 */
export const UBL_NS = {
  Invoice: 'urn:oasis:names:specification:ubl:schema:xsd:Invoice-2',
  CreditNote: 'urn:oasis:names:specification:ubl:schema:xsd:CreditNote-2',
  cac: 'urn:oasis:names:specification:ubl:schema:xsd:CommonAggregateComponents-2',
  cbc: 'urn:oasis:names:specification:ubl:schema:xsd:CommonBasicComponents-2',
} as const;

export interface UblSupplier {
  name: string;
  addressLine1: string;
  addressLine2: string;
  city: string;
  region: string;
  postalCode: string;
  country: string;
  phone: string;
  email: string;
}

/** UN/CEFACT code list 1001 (document name codes): 380 commercial invoice, 381 credit note. */
const TYPE_CODE = { Invoice: '380', CreditNote: '381' } as const;
/** UN/ECE Recommendation 20 unit code "C62": one (a unit). */
const UNIT_ONE = 'C62';

function address(parent: XMLBuilder, a: { line1: string; line2: string; city: string; postalCode: string; region: string; country?: string }) {
  if (![a.line1, a.line2, a.city, a.postalCode, a.region, a.country].some(Boolean)) return;
  // cac:PostalAddress (AddressType): StreetName, AdditionalStreetName, CityName, PostalZone, CountrySubentity, Country.
  const el = parent.ele(UBL_NS.cac, 'cac:PostalAddress');
  if (a.line1) el.ele(UBL_NS.cbc, 'cbc:StreetName').txt(a.line1);
  if (a.line2) el.ele(UBL_NS.cbc, 'cbc:AdditionalStreetName').txt(a.line2);
  if (a.city) el.ele(UBL_NS.cbc, 'cbc:CityName').txt(a.city);
  if (a.postalCode) el.ele(UBL_NS.cbc, 'cbc:PostalZone').txt(a.postalCode);
  if (a.region) el.ele(UBL_NS.cbc, 'cbc:CountrySubentity').txt(a.region);
  if (a.country) el.ele(UBL_NS.cac, 'cac:Country').ele(UBL_NS.cbc, 'cbc:IdentificationCode').txt(a.country);
}

function party(parent: XMLBuilder, p: { name: string; address: Parameters<typeof address>[1]; phone: string; email: string }) {
  // cac:Party (PartyType): PartyName, PostalAddress, Contact.
  const el = parent.ele(UBL_NS.cac, 'cac:Party');
  el.ele(UBL_NS.cac, 'cac:PartyName').ele(UBL_NS.cbc, 'cbc:Name').txt(p.name);
  address(el, p.address);
  if (p.phone || p.email) {
    // cac:Contact (ContactType): Telephone, ElectronicMail.
    const contact = el.ele(UBL_NS.cac, 'cac:Contact');
    if (p.phone) contact.ele(UBL_NS.cbc, 'cbc:Telephone').txt(p.phone);
    if (p.email) contact.ele(UBL_NS.cbc, 'cbc:ElectronicMail').txt(p.email);
  }
}

/**
 * One paid invoice or credit note (a row of the UBL export's query) as a UBL 2.1 XML document.
 * Amounts come as cents text and are written as decimals with two places, with currencyID.
 */
export function ublDocument(row: TextRow, supplier: UblSupplier, currency: string): string {
  const root = row.kind === 'credit_note' ? 'CreditNote' : 'Invoice';
  const money = (el: XMLBuilder, name: string, cents: string | null) => el.ele(UBL_NS.cbc, `cbc:${name}`, { currencyID: currency }).txt(centsText(cents));
  const doc = create({ version: '1.0', encoding: 'UTF-8' });
  const top = doc.ele(UBL_NS[root], root, { 'xmlns:cac': UBL_NS.cac, 'xmlns:cbc': UBL_NS.cbc });
  const cbc = (name: string, text: string, attrs?: Record<string, string>) => top.ele(UBL_NS.cbc, `cbc:${name}`, attrs).txt(text);

  cbc('UBLVersionID', '2.1');
  cbc('ID', row.number ?? '');
  cbc('IssueDate', row.issue_date ?? '');
  if (root === 'Invoice' && row.due_date) cbc('DueDate', row.due_date);
  cbc(root === 'Invoice' ? 'InvoiceTypeCode' : 'CreditNoteTypeCode', TYPE_CODE[root], { listID: 'UNCL1001' });
  cbc('Note', `${INVOICE_KIND_LABELS[row.kind as InvoiceKind] ?? row.kind}, booking ${row.booking}`);
  if (row.reason) cbc('Note', row.reason);
  cbc('DocumentCurrencyCode', currency);
  if (row.credits_number) {
    // cac:BillingReference/cac:InvoiceDocumentReference (DocumentReferenceType): ID, IssueDate.
    const ref = top.ele(UBL_NS.cac, 'cac:BillingReference').ele(UBL_NS.cac, 'cac:InvoiceDocumentReference');
    ref.ele(UBL_NS.cbc, 'cbc:ID').txt(row.credits_number);
    if (row.credits_issue_date) ref.ele(UBL_NS.cbc, 'cbc:IssueDate').txt(row.credits_issue_date);
  }
  party(top.ele(UBL_NS.cac, 'cac:AccountingSupplierParty'), {
    name: supplier.name,
    address: { line1: supplier.addressLine1, line2: supplier.addressLine2, city: supplier.city, postalCode: supplier.postalCode, region: supplier.region, country: supplier.country },
    phone: supplier.phone,
    email: supplier.email,
  });
  party(top.ele(UBL_NS.cac, 'cac:AccountingCustomerParty'), {
    name: row.customer_name ?? '',
    address: { line1: row.billing_line1 ?? '', line2: row.billing_line2 ?? '', city: row.billing_city ?? '', postalCode: row.billing_postal_code ?? '', region: row.billing_region ?? '' },
    phone: row.customer_phone ?? '',
    email: row.customer_email ?? '',
  });
  if (root === 'Invoice') {
    const payments = (JSON.parse(row.payments ?? 'null') as { id: string; amount: string; date: string }[] | null) ?? [];
    for (const p of payments) {
      // cac:PrepaidPayment (PaymentType): ID, PaidAmount, ReceivedDate.
      const el = top.ele(UBL_NS.cac, 'cac:PrepaidPayment');
      el.ele(UBL_NS.cbc, 'cbc:ID').txt(p.id);
      money(el, 'PaidAmount', p.amount);
      el.ele(UBL_NS.cbc, 'cbc:ReceivedDate').txt(p.date);
    }
  }
  money(top.ele(UBL_NS.cac, 'cac:TaxTotal'), 'TaxAmount', row.tax);
  // cac:LegalMonetaryTotal (MonetaryTotalType): LineExtensionAmount, TaxExclusiveAmount, TaxInclusiveAmount, PrepaidAmount, PayableAmount.
  const totals = top.ele(UBL_NS.cac, 'cac:LegalMonetaryTotal');
  money(totals, 'LineExtensionAmount', row.net);
  money(totals, 'TaxExclusiveAmount', row.net);
  money(totals, 'TaxInclusiveAmount', row.total);
  money(totals, 'PrepaidAmount', row.prepaid);
  money(totals, 'PayableAmount', row.payable);

  const lines = (JSON.parse(row.lines ?? '[]') as InvoiceLineRow[]).filter((l) => l.category !== 'tax');
  lines.forEach((l, i) => {
    // cac:InvoiceLine / cac:CreditNoteLine: ID, InvoicedQuantity | CreditedQuantity, LineExtensionAmount, Item (Name), Price (PriceAmount).
    const line = top.ele(UBL_NS.cac, `cac:${root}Line`);
    line.ele(UBL_NS.cbc, 'cbc:ID').txt(String(i + 1));
    line.ele(UBL_NS.cbc, root === 'Invoice' ? 'cbc:InvoicedQuantity' : 'cbc:CreditedQuantity', { unitCode: UNIT_ONE }).txt('1');
    money(line, 'LineExtensionAmount', String(l.amountCents));
    line.ele(UBL_NS.cac, 'cac:Item').ele(UBL_NS.cbc, 'cbc:Name').txt(l.description);
    money(line.ele(UBL_NS.cac, 'cac:Price'), 'PriceAmount', String(l.amountCents));
  });
  return doc.end({ prettyPrint: true });
}
