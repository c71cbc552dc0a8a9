import { z } from 'zod';

const optionalText = (max: number, label: string) =>
  z.string().trim().max(max, `${label}: use at most ${max} characters.`);

export const CURRENCIES = ['USD', 'CAD', 'EUR', 'GBP', 'AUD', 'NZD'] as const;

function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

export const OrganizationSettings = z.object({
  name: z.string({ error: 'Enter the company name.' }).trim().min(2, 'Enter the company name.').max(160, 'Use at most 160 characters.'),
  addressLine1: optionalText(160, 'Address'),
  addressLine2: optionalText(160, 'Address'),
  city: optionalText(80, 'City'),
  region: optionalText(80, 'State or region'),
  postalCode: optionalText(20, 'Postal code'),
  country: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^([A-Z]{2})?$/, 'Use the two-letter country code, like US or CA.'),
  phone: z
    .string()
    .trim()
    .max(40, 'Use at most 40 characters.')
    .regex(/^[0-9+().\-\s]*$/, 'Use digits, spaces and + ( ) - . only.'),
  email: z.union([z.literal(''), z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }))]),
  currency: z.enum(CURRENCIES, { error: `Choose one of ${CURRENCIES.join(', ')}.` }),
  timeZone: z.string().trim().refine(isTimeZone, 'Choose a time zone from the list, like America/Chicago.'),
});
export type OrganizationSettings = z.infer<typeof OrganizationSettings>;

export const UpdateOrganizationRequest = OrganizationSettings.partial();
export type UpdateOrganizationRequest = z.infer<typeof UpdateOrganizationRequest>;

export const OrganizationResponse = OrganizationSettings.extend({ id: z.string(), hasLogo: z.boolean(), can: z.object({ update: z.boolean() }) });
export type OrganizationResponse = z.infer<typeof OrganizationResponse>;
