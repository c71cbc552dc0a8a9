/** Every cache key of the customer's pages starts here, so signing in or out forgets them all at once. */
export const portalBaseKey = ['portal'] as const;

/** Pay links are keyed by their token; nothing under them belongs to a session. */
export const payLinkBaseKey = ['pay-link'] as const;
