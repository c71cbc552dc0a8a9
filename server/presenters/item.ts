import type { ItemRow } from '../../shared/schemas/items';
import type { Item, User } from '../models';
import { can } from '../policies';

export function presentItem(item: Item, actor: User): ItemRow {
  const seePrices = can(actor, 'item', 'seePrices');
  const price = (cents: number) => (seePrices ? cents : 0);
  return {
    id: item.id,
    name: item.name,
    kind: item.kind,
    sku: item.sku,
    description: item.description,
    quantityOwned: item.quantityOwned,
    rentalPriceCents: price(item.rentalPriceCents),
    extraDayPriceCents: price(item.extraDayPriceCents),
    replacementValueCents: price(item.replacementValueCents),
    purchaseCostCents: price(item.purchaseCostCents),
    taxable: item.taxable,
    active: item.active,
    tentType: item.tentType ?? null,
    widthFt: item.widthFt ?? null,
    lengthFt: item.lengthFt ?? null,
    heightFt: item.heightFt ?? null,
    sectionLengthFt: item.sectionLengthFt ?? null,
    seats: item.seats ?? null,
    polesPerSetup: item.polesPerSetup ?? null,
    stakesPerSetup: item.stakesPerSetup ?? null,
    ballastPerSetupLbs: item.ballastPerSetupLbs ?? null,
    serviceType: item.serviceType ?? null,
    createdAt: item.createdAt.toISOString(),
    updatedAt: item.updatedAt.toISOString(),
    can: { update: can(actor, 'item', 'update', item), seePrices },
  };
}
