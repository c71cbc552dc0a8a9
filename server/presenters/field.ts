/**
 * Field answers: stops, site checks, photos and return check-ins. Every field is listed, and none
 * is money: the crew reads all of these (the office's proposed charges are presented in
 * presenters/fieldCharges.ts).
 */
import type { LoadListStop } from '../../shared/loadList';
import type {
  CrewMember, FieldSite, FieldStop, PhotoRow, ReturnCheckRow, ReturnLineRow, SiteCheckRow, StopItem,
} from '../../shared/schemas/field';
import type { ItemKind } from '../../shared/schemas/items';
import { stakingReadiness } from '../../shared/siteSafety';
import type { Booking, BookingLine, Customer, FieldPhoto, Item, ReturnCheck, ReturnCheckLine, SiteCheck, StoredFile } from '../models';

export type FieldItem = Pick<Item, 'id' | 'name' | 'kind' | 'polesPerSetup' | 'stakesPerSetup' | 'ballastPerSetupLbs' | 'widthFt' | 'lengthFt'>;
export type FieldLine = BookingLine & { item?: FieldItem | null };
export type FieldBookingRow = Booking & { customer: Customer; lines: FieldLine[] };

/** A line that goes on the truck: rentals, never services or fees. */
export const loads = (l: FieldLine) => l.kind === 'rental' && l.item?.kind !== 'service';

/** The key a line is counted under on the truck and at check-in: its catalog item, or its own words. */
export const lineKey = (l: Pick<BookingLine, 'itemId' | 'description'>) => l.itemId ?? `text:${l.description.trim().toLowerCase()}`;

/** The booking's stock, one entry per item (lines of the same item add up), in the booking's order. */
export function stopItems(booking: { lines: FieldLine[] }): (StopItem & { key: string })[] {
  const byKey = new Map<string, StopItem & { key: string }>();
  for (const l of [...booking.lines].sort((a, b) => a.position - b.position)) {
    if (!loads(l)) continue;
    const key = lineKey(l);
    const row = byKey.get(key) ?? { key, itemId: l.itemId, name: l.item?.name ?? l.description, kind: (l.item?.kind as ItemKind | undefined) ?? null, quantity: 0 };
    row.quantity += l.quantity;
    byKey.set(key, row);
  }
  return [...byKey.values()];
}

export function presentSite(b: Booking): FieldSite {
  const cityLine = [b.siteCity, [b.siteRegion, b.sitePostalCode].filter(Boolean).join(' ')].filter(Boolean).join(', ');
  const address = [b.siteLine1, b.siteLine2, cityLine].filter((s) => s.trim()).join(', ');
  return {
    line1: b.siteLine1,
    line2: b.siteLine2,
    city: b.siteCity,
    region: b.siteRegion,
    postalCode: b.sitePostalCode,
    address,
    // RFC 5870 geo URI; the q= query (an address search) is what phone map apps read.
    mapUrl: address ? `geo:0,0?q=${encodeURIComponent(address)}` : null,
    notes: b.siteNotes,
    surface: b.surface,
    anchoring: b.anchoring,
  };
}

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

export function presentStop(
  booking: FieldBookingRow,
  stop: 'delivery' | 'pickup',
  parts: { crew: CrewMember[]; viewerId: string; siteCheck: SiteCheck | null; returnCheck: ReturnCheck | null },
): FieldStop {
  return {
    bookingId: booking.id,
    reference: booking.reference,
    status: booking.status,
    stop,
    windowStart: (stop === 'delivery' ? booking.deliveryStart : booking.pickupStart).toISOString(),
    windowEnd: (stop === 'delivery' ? booking.deliveryEnd : booking.pickupEnd).toISOString(),
    eventStart: booking.eventStart.toISOString(),
    eventEnd: booking.eventEnd.toISOString(),
    customer: { name: booking.customer.name, phone: booking.customer.phone },
    site: presentSite(booking),
    guestCount: booking.guestCount,
    seating: booking.seating,
    afterDark: booking.afterDark,
    items: stopItems(booking).map(({ itemId, name, kind, quantity }) => ({ itemId, name, kind, quantity })),
    crew: parts.crew,
    mine: parts.crew.some((c) => c.id === parts.viewerId),
    progress: {
      readyToStakeAt: iso(parts.siteCheck?.readyToStakeAt),
      deliveredAt: iso(parts.siteCheck?.deliveredAt),
      setUpAt: iso(parts.siteCheck?.setUpAt),
      checkedInAt: iso(parts.returnCheck?.submittedAt),
    },
  };
}

/** The load list's view of a stop. */
export function loadListStop(booking: FieldBookingRow, stop: 'delivery' | 'pickup'): LoadListStop {
  return {
    bookingId: booking.id,
    reference: booking.reference,
    stop,
    anchoring: booking.anchoring,
    lines: booking.lines.map((l) => ({
      itemId: l.itemId,
      name: l.item?.name ?? l.description,
      kind: (l.item?.kind as ItemKind | undefined) ?? null,
      quantity: l.quantity,
      lineKind: l.kind,
      polesPerSetup: l.item?.polesPerSetup ?? null,
      stakesPerSetup: l.item?.stakesPerSetup ?? null,
      ballastPerSetupLbs: l.item?.ballastPerSetupLbs ?? null,
    })),
  };
}

export function presentSiteCheck(booking: Booking, check: SiteCheck | null, names: Map<string, string>): SiteCheckRow {
  // Before the crew saves anything, the office's locate details on the booking fill the form.
  const locateNumber = check ? check.locateNumber : booking.utilityLocateNumber;
  const hardSurfaceBallast = check?.hardSurfaceBallast ?? false;
  return {
    locateRequested: check ? check.locateRequested : !!booking.utilityLocateNumber || !!booking.utilityLocateDate,
    locateRequestedOn: check ? (check.locateRequestedOn ?? null) : (booking.utilityLocateDate ?? null),
    locateNumber,
    hardSurfaceBallast,
    privateLines: check?.privateLines ?? 'not_asked',
    privateLinesNotes: check?.privateLinesNotes ?? '',
    buildingClearanceFt: check?.buildingClearanceFt ?? null,
    lotLineClearanceFt: check?.lotLineClearanceFt ?? null,
    windMph: check?.windMph ?? null,
    exitsPlanned: check?.exitsPlanned ?? false,
    notes: check?.notes ?? '',
    // Ready only once marked so: the rule says whether it could be.
    readyToStake: check?.readyToStakeAt ? { ready: true, reason: null } : { ...stakingReadiness({ locateNumber: check?.locateNumber ?? '', hardSurfaceBallast }), ready: false },
    updatedAt: check ? check.updatedAt.toISOString() : null,
    updatedBy: check?.updatedById ? (names.get(check.updatedById) ?? 'Former user') : null,
  };
}

export function presentPhoto(photo: FieldPhoto, file: Pick<StoredFile, 'contentType' | 'size'>, names: Map<string, string>, canRemove: boolean): PhotoRow {
  return {
    id: photo.id,
    stage: photo.stage,
    lineKey: photo.lineKey,
    caption: photo.caption,
    contentType: file.contentType,
    size: file.size,
    uploadedBy: photo.uploadedById ? (names.get(photo.uploadedById) ?? 'Former user') : 'Unknown',
    createdAt: photo.createdAt.toISOString(),
    url: `/api/field/photos/${photo.id}`,
    canRemove,
  };
}

/** The check-in as saved, or a fresh one where every unit is assumed back until counted. */
export function presentReturnCheck(booking: FieldBookingRow, check: (ReturnCheck & { lines?: ReturnCheckLine[] }) | null, names: Map<string, string>): ReturnCheckRow {
  const saved = new Map((check?.lines ?? []).map((l) => [l.lineKey, l]));
  const lines: ReturnLineRow[] = stopItems(booking).map((it) => {
    const s = saved.get(it.key);
    const returned = s ? s.returned : it.quantity;
    const damaged = s ? s.damaged : 0;
    return { key: it.key, itemId: it.itemId, description: it.name, kind: it.kind, sent: it.quantity, returned, damaged, missing: it.quantity - returned, notes: s?.notes ?? '' };
  });
  return {
    lines,
    notes: check?.notes ?? '',
    submittedAt: iso(check?.submittedAt),
    submittedBy: check?.submittedById ? (names.get(check.submittedById) ?? 'Former user') : null,
    savedAt: check ? check.updatedAt.toISOString() : null,
  };
}
