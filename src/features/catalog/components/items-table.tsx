import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import type { ItemListQuery, ItemRow } from '@shared/schemas/items';
import { Badge } from '@/components/ui/badge';
import { SortHeader } from '@/components/ui/sort-header';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatDate } from '@/lib/format';
import { kindLabel } from './item-kinds';

type SortKey = ItemListQuery['sort'];

interface ItemsTableProps {
  items: readonly ItemRow[];
  currency: string;
  /** Crew see no prices: the price column is left out. */
  showPrices: boolean;
  sort: SortKey;
  dir: 'asc' | 'desc';
  onSort: (sort: SortKey) => void;
}

export function ItemsTable({ items, currency, showPrices, sort, dir, onSort }: ItemsTableProps) {
  const header = (key: SortKey, label: string, className?: string) => (
    <SortHeader label={label} active={sort === key} dir={dir} onSort={() => onSort(key)} className={className} />
  );
  return (
    <Table caption="Catalog items">
      <THead>
        <Tr>
          {header('name', 'Name')}
          {header('kind', 'Kind')}
          <Th>SKU</Th>
          {header('quantityOwned', 'Owned', 'text-right')}
          {showPrices ? header('rentalPriceCents', 'Rental price', 'text-right') : null}
          <Th>Status</Th>
          {header('updatedAt', 'Updated')}
        </Tr>
      </THead>
      <TBody>
        {items.map((item) => (
          <Tr key={item.id}>
            <Th scope="row" className="py-3">
              <Link className={linkClasses} to={paths.app.catalogItem.getHref(item.id)}>
                {item.name}
              </Link>
              {item.kind === 'tent' && item.widthFt && item.lengthFt ? (
                <span className="block text-xs font-normal text-canvas-600">
                  {item.widthFt} x {item.lengthFt} ft {item.tentType ?? ''}
                </span>
              ) : null}
            </Th>
            <Td className="whitespace-nowrap">{kindLabel(item.kind)}</Td>
            <Td className="whitespace-nowrap text-canvas-700">{item.sku || '—'}</Td>
            <Td className="text-right tabular-nums">{item.kind === 'service' ? '—' : item.quantityOwned}</Td>
            {showPrices ? <Td className="text-right whitespace-nowrap tabular-nums">{formatMoney(item.rentalPriceCents, currency)}</Td> : null}
            <Td>{item.active ? <Badge tone="positive">Active</Badge> : <Badge>Inactive</Badge>}</Td>
            <Td className="whitespace-nowrap text-canvas-700">{formatDate(item.updatedAt)}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
