/** A PDF of the signed-in customer's: invoice, signed agreement, receipt. Same-origin, so the session cookie goes with it. */
export const portalDocumentUrl = (documentId: string) => `/api/portal/documents/${encodeURIComponent(documentId)}/pdf`;
