import type { Role } from '@shared/types';

/** What each role does in the company, in plain words: what Guyline lets them do. */
const ROLE_TEXT: Record<Role, { today: string; more: string }> = {
  owner: {
    today: 'You look after the company’s account, its price list and rules, who works in Guyline and what each person may do — and everything the office does.',
    more: 'Refunds, voids, paying back account credit and the company settings are yours alone; the bookkeeper and you take the exports and read the reports.',
  },
  office: {
    today: 'You take enquiries, keep the customer list, size tents with the planner, price bookings and reserve the stock they need.',
    more: 'You send rental agreements for signature, issue invoices, record cash, check and transfer payments, and bill damage after a return.',
  },
  crew: {
    today: 'Day sheets show each day’s deliveries and pickups with the site, the load list and your own stops first. On a stop you fill in the site checklist, mark it delivered and set up with photos, and check in what comes back. Prices stay with the office.',
    more: 'Subscribe to your stops in your phone’s calendar from Day sheets, My calendar feed.',
  },
  bookkeeper: {
    today: 'You read bookings with their quotes, the invoices, payments and the ledger behind every balance.',
    more: 'Exports take paid invoices, payments and the journal to your own books; Reports show what is owed, deposits held and sales tax.',
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
      <p className="text-canvas-700">{text.more}</p>
    </div>
  );
}
