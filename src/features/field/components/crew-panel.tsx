import { useEffect, useState } from 'react';
import { ROLE_LABELS } from '@shared/types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Spinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useAssignCrew } from '../api/assign-crew';
import { useBookingCrew } from '../api/get-booking-crew';
import { useCrewMembers } from '../api/get-crew-members';

/** On the booking page: who goes out on it. The office ticks people; everyone else reads the names. */
export function CrewPanel({ bookingId, onField }: { bookingId: string; onField: boolean }) {
  const crew = useBookingCrew(bookingId);
  const canAssign = crew.data?.can.assign ?? false;
  const members = useCrewMembers(canAssign);
  const assign = useAssignCrew(bookingId);
  const [chosen, setChosen] = useState<string[]>([]);
  const [saved, setSaved] = useState(false);
  const current = crew.data?.data.map((m) => m.id).sort().join(',');
  useEffect(() => setChosen(crew.data?.data.map((m) => m.id) ?? []), [current]); // eslint-disable-line react-hooks/exhaustive-deps

  if (crew.isPending) return <Spinner label="Loading the crew…" className="text-canvas-600" />;
  if (crew.isError) return <Alert tone="danger">{errorMessage(crew.error)}</Alert>;
  const dirty = [...chosen].sort().join(',') !== current;
  return (
    <div className="space-y-3 text-sm">
      {!canAssign ? (
        <p>{crew.data.data.length ? crew.data.data.map((m) => m.name).join(', ') : 'Nobody is assigned yet.'}</p>
      ) : members.isPending ? (
        <Spinner label="Loading people…" className="text-canvas-600" />
      ) : members.isError ? (
        <Alert tone="danger">{errorMessage(members.error)}</Alert>
      ) : (
        <fieldset className="space-y-2">
          <legend className="font-semibold text-canvas-900">Crew on this booking</legend>
          {members.data.data.map((m) => (
            <Checkbox
              key={m.id}
              label={`${m.name} (${ROLE_LABELS[m.role]})`}
              checked={chosen.includes(m.id)}
              onChange={(e) => {
                setSaved(false);
                setChosen((c) => (e.target.checked ? [...c, m.id] : c.filter((x) => x !== m.id)));
              }}
            />
          ))}
          <div className="flex flex-wrap items-center gap-3 pt-1">
            <Button size="sm" disabled={!dirty} isLoading={assign.isPending} onClick={() => assign.mutate(chosen, { onSuccess: () => setSaved(true) })}>
              Save crew
            </Button>
            <span aria-live="polite">{saved ? 'Crew saved.' : ''}</span>
          </div>
          {assign.isError ? <Alert tone="danger">{errorMessage(assign.error)}</Alert> : null}
        </fieldset>
      )}
      {onField ? <TextLink to={paths.app.fieldBooking.getHref(bookingId)}>Open the field page (site checklist, photos, check-in)</TextLink> : null}
    </div>
  );
}
