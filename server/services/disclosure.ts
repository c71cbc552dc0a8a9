import type { Disclosure } from '../../shared/schemas/signing';
import type { Organization } from '../models';

/**
 * The consumer disclosure shown before consent to electronic records, one entry per element of
 * 15 U.S.C. §7001(c)(1)(B)–(C). Plain words of our own, filled with the company's contact details.
 */
export function disclosureFor(org: Pick<Organization, 'name' | 'email' | 'phone' | 'addressLine1' | 'city' | 'region' | 'postalCode'>): Disclosure {
  const contact = [org.email && `e-mail ${org.email}`, org.phone && `call ${org.phone}`].filter(Boolean).join(' or ') || 'contact us';
  const address = [org.addressLine1, org.city, org.region, org.postalCode].filter(Boolean).join(', ');
  return {
    paperCopy: `You have the right to receive this rental agreement on paper instead of electronically. If you prefer paper, do not agree below: ${contact} and ${org.name} will give you a paper copy to sign.`,
    withdrawal: `You may withdraw your consent to electronic records at any time before you sign, by choosing "I do not agree" on this page or by telling us. Withdrawing costs nothing; it only means we will complete this agreement with you on paper, which can take longer. Records you already signed electronically stay valid.`,
    scope: `Your consent covers only this rental agreement and the records that come with it (the signed copy and its signing certificate). It does not cover other agreements or bookings.`,
    procedures: `To withdraw your consent, or to give us a new e-mail address or phone number, ${contact}${address ? `, or write to ${org.name}, ${address}` : ''}. Please tell us if your e-mail address changes, so the signed copy reaches you.`,
    paperCopyRequest: `After you sign, you can ask for a paper copy of the signed agreement at any time, free of charge: ${contact}.`,
    requirements: `To open and keep these records you need a device with a current web browser (for example an up-to-date phone or computer browser), an e-mail address, a program that opens PDF files (most browsers and phones do), and storage or a printer to keep a copy.`,
    demonstration: `To show that you can open the records, open the agreement as a PDF with the link on this page before you agree.`,
  };
}
