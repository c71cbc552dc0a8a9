/** Enums both sides switch on. */
export const ROLES = ['owner', 'office', 'crew', 'bookkeeper'] as const;
export type Role = (typeof ROLES)[number];

export const USER_STATUSES = ['invited', 'active', 'disabled'] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

/** Areas of the app a role may open; the server sends these so the client can build its navigation. */
export const AREAS = ['dashboard', 'field', 'bookings', 'invoices', 'exports', 'reports', 'customers', 'catalog', 'users', 'settings', 'devInbox'] as const;
export type Area = (typeof AREAS)[number];

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  office: 'Office',
  crew: 'Crew',
  bookkeeper: 'Bookkeeper',
};

/** The CSRF double-submit cookie and header names. */
export const CSRF_COOKIE = 'guyline_csrf';
export const CSRF_HEADER = 'X-CSRF-Token';
export const SESSION_COOKIE = 'guyline_session';

export const PASSWORD_MIN_LENGTH = 10;
