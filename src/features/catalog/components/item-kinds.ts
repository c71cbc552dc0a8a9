import { ITEM_KIND_LABELS, ITEM_KINDS, SERVICE_TYPES, TENT_TYPES, type ItemKind } from '@shared/schemas/items';

export const kindOptions = ITEM_KINDS.map((kind) => ({ value: kind, label: ITEM_KIND_LABELS[kind] }));

export const TENT_TYPE_LABELS: Record<(typeof TENT_TYPES)[number], string> = { pole: 'Pole tent', frame: 'Frame tent' };
export const tentTypeOptions = TENT_TYPES.map((t) => ({ value: t, label: TENT_TYPE_LABELS[t] }));

export const SERVICE_TYPE_LABELS: Record<(typeof SERVICE_TYPES)[number], string> = {
  delivery: 'Delivery',
  setup: 'Set-up',
  takedown: 'Take-down',
  other: 'Other',
};
export const serviceTypeOptions = SERVICE_TYPES.map((t) => ({ value: t, label: SERVICE_TYPE_LABELS[t] }));

/** The measurement fields each kind asks for; the rest are sent as null. */
export const KIND_FIELDS: Record<ItemKind, readonly string[]> = {
  tent: ['tentType', 'widthFt', 'lengthFt', 'heightFt', 'polesPerSetup', 'stakesPerSetup', 'ballastPerSetupLbs'],
  sidewall: ['sectionLengthFt', 'heightFt'],
  table: ['lengthFt', 'seats'],
  chair: [],
  lighting: [],
  accessory: [],
  service: ['serviceType'],
};

export function kindLabel(kind: string): string {
  return (ITEM_KIND_LABELS as Record<string, string>)[kind] ?? kind;
}
