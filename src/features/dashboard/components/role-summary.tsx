import type { Role } from '@shared/types';

/** What each role does in the company, in plain words, and what Guyline lets them do today. */
const ROLE_TEXT: Record<Role, { today: string; later: string }> = {
  owner: {
    today: 'You look after the company’s account: its details, who works in Guyline and what each person may do.',
    later: 'As the price list, bookings, rental agreements and payments arrive in Guyline, you will be able to manage all of them, including refunds and voids.',
  },
  office: {
    today: 'For now you can see your company’s details below.',
    later: 'Customers, quotes, bookings, rental agreements, invoices and offline payments will be yours to handle as those screens arrive.',
  },
  crew: {
    today: 'For now you can see your company’s details below.',
    later: 'Day sheets, load lists, site details, photos and the damage check-in after pick-up will be here for you as those screens arrive.',
  },
  bookkeeper: {
    today: 'For now you can see your company’s details below.',
    later: 'Bookings, invoices, payments, exports and reports will be open to you for reading as those screens arrive.',
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
