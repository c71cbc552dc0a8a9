/**
 * GET /api/dashboard: the Home screen's figures for the signed-in person. Each part is null when
 * the person's role does not cover it (the crew never gets money).
 */
export interface DashboardSummary {
  /** The company's today, YYYY-MM-DD. */
  today: string;
  /** Today's stops, as on the day sheet (people who work the field only). */
  stops: { deliveries: number; pickups: number; mine: number } | null;
  bookings: {
    /** Quotes sent and waiting for the customer. */
    quoted: number;
    /** Rental agreements sent for signature and not signed yet (the link still valid). */
    awaitingSignature: number;
    /** Reserved or out, with the event starting in the next seven days (today included). */
    startingThisWeek: number;
  };
  money: {
    currency: string;
    /** Issued invoices not paid in full: what customers owe now. */
    openCount: number;
    openCents: number;
    /** Of those, past their due date. */
    overdueCount: number;
    overdueCents: number;
    /** Money that came in over the last seven days (cash, check, transfer and card; not credit moved between invoices). */
    receivedLast7DaysCents: number;
  } | null;
}
