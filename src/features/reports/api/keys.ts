/**
 * Every report sits under this key: a payment, credit note or refund anywhere changes their
 * figures, and the reports are read-only, so they are simply fetched again when opened.
 */
export const reportsBaseKey = ['reports'] as const;
