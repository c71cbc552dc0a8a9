import type { Role } from '@shared/types';

/** What each role does in the company, in plain words, and what Guyline lets them do today. */
const ROLE_TEXT: Record<Role, { today: string; later: string }> = {
  owner: {
    today: 'You look after the company’s account, its price list and rules, who works in Guyline and what each person may do — and everything the office does.',
    later: 'Rental agreements, payments, refunds and voids are on their way.',
  },
  office: {
    today: 'You take enquiries, keep the customer list, size tents with the planner, price bookings and reserve the stock they need.',
    later: 'Rental agreements, invoices and offline payments are on their way.',
  },
  crew: {
    today: 'Day sheets show each day’s deliveries and pickups with the site, the load list and your own stops first. On a stop you fill in the site checklist, mark it delivered and set up with photos, and check in what comes back. Prices stay with the office.',
    later: 'Subscribe to your stops in your phone’s calendar from Day sheets, My calendar feed.',
  },
  bookkeeper: {
    today: 'You can read bookings with their quotes, the customers and the catalog.',
    later: 'Invoices, payments, exports and reports are on their way.',
  },
};

export function RoleSummary({ role, roleLabel }: { role: Role; roleLabel: string }) {
  const text = ROLE_TEXT[role];
  return (
    <div className="space-y-2 text-canvas-800">
      <p>
        Your role: <strong>{roleLabel}</strong>.
      </p>
      <p>{text.today}</p>
      <p className="text-canvas-700">{text.later}</p>
    </div>
  );
}
