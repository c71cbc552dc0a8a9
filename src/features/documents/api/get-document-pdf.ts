/**
 * GET /api/documents/:id/pdf sends the stored bytes. The browser fetches it itself (a download
 * link, or an <iframe> for the inline preview), so this file only builds the addresses.
 */
export const documentPdfUrl = (id: string) => `/api/documents/${encodeURIComponent(id)}/pdf`;

/** The same PDF served inline, for the preview inside the page. */
export const documentPdfInlineUrl = (id: string) => `${documentPdfUrl(id)}?inline=1`;
