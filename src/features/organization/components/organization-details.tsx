import type { OrganizationResponse } from '@shared/schemas/organization';

function addressLines(o: OrganizationResponse): string[] {
  const cityLine = [o.city, [o.region, o.postalCode].filter(Boolean).join(' ')].filter(Boolean).join(', ');
  return [o.addressLine1, o.addressLine2, cityLine, o.country].filter(Boolean);
}

/** The company's details as text, for people who may read but not change them. */
export function OrganizationDetails({ organization }: { organization: OrganizationResponse }) {
  const rows: Array<[string, React.ReactNode]> = [
    ['Company name', organization.name],
    [
      'Address',
      addressLines(organization).length ? (
        <>
          {addressLines(organization).map((line) => (
            <span key={line} className="block">
              {line}
            </span>
          ))}
        </>
      ) : null,
    ],
    ['Phone', organization.phone],
    ['E-mail', organization.email],
    ['Currency', organization.currency],
    ['Time zone', organization.timeZone],
  ];
  return (
    <dl className="divide-y divide-canvas-200">
      {rows.map(([label, value]) => (
        <div key={label} className="grid gap-1 py-3 sm:grid-cols-3 sm:gap-4">
          <dt className="text-sm font-semibold text-canvas-700">{label}</dt>
          <dd className="text-canvas-900 sm:col-span-2">{value || <span className="text-canvas-600">Not given</span>}</dd>
        </div>
      ))}
    </dl>
  );
}
