import { Link } from 'react-router';
import type { CustomerRow } from '@shared/schemas/customers';
import { Badge } from '@/components/ui/badge';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';

export function CustomersTable({ customers }: { customers: readonly CustomerRow[] }) {
  return (
    <Table caption="Customers">
      <THead>
        <Tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Phone</Th>
          <Th>City</Th>
          <Th className="text-right">Bookings</Th>
          <Th>Tax</Th>
        </Tr>
      </THead>
      <TBody>
        {customers.map((c) => (
          <Tr key={c.id}>
            <Th scope="row" className="py-3">
              <Link className={linkClasses} to={paths.app.customer.getHref(c.id)}>
                {c.name}
              </Link>
              {c.contactName ? <span className="block text-xs font-normal text-canvas-600">{c.contactName}</span> : null}
            </Th>
            <Td className="whitespace-nowrap">{c.email || '—'}</Td>
            <Td className="whitespace-nowrap">{c.phone || '—'}</Td>
            <Td className="whitespace-nowrap">{c.billingCity || '—'}</Td>
            <Td className="text-right tabular-nums">{c.bookingCount}</Td>
            <Td>{c.taxExempt ? <Badge tone="caution">Tax exempt</Badge> : null}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
