import { useState } from 'react';
import { PHOTO_STAGE_LABELS, type PhotoRow } from '@shared/schemas/field';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { errorMessage } from '@/lib/api';
import { formatDateTime } from '@/lib/format';
import { useRemovePhoto } from '../api/remove-photo';

const describe = (p: PhotoRow) => `${PHOTO_STAGE_LABELS[p.stage]} photo${p.caption ? `: ${p.caption}` : ''}`;

/**
 * Photos as thumbnails; each opens full size. They are served as images only (nosniff). A photo
 * taken by mistake can come off (whoever took it, or the office) until the stock is checked in.
 */
export function PhotoList({ photos, bookingId, empty = 'No photos yet.' }: { photos: PhotoRow[]; bookingId: string; empty?: string }) {
  const [removing, setRemoving] = useState<PhotoRow | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const remove = useRemovePhoto(bookingId);
  if (!photos.length) {
    return (
      <>
        {done ? <p role="status" className="text-sm text-canvas-700">{done}</p> : null}
        <p className="text-sm text-canvas-600">{empty}</p>
      </>
    );
  }
  return (
    <>
      {done ? <p role="status" className="mb-2 text-sm text-canvas-700">{done}</p> : null}
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        {photos.map((p) => (
          <li key={p.id} className="text-xs text-canvas-700">
            <a href={p.url} target="_blank" rel="noopener" className="block overflow-hidden rounded-md border border-canvas-200 bg-canvas-100">
              <img src={p.url} alt={describe(p)} loading="lazy" className="aspect-square w-full object-cover" />
            </a>
            <p className="mt-1 font-semibold">{p.caption || PHOTO_STAGE_LABELS[p.stage]}</p>
            <p>
              {p.uploadedBy}, {formatDateTime(p.createdAt)}
            </p>
            {p.canRemove ? (
              <Button size="sm" variant="ghost" className="mt-1 text-rust-700 hover:bg-rust-50" aria-label={`Remove ${describe(p)}`} onClick={() => {
                remove.reset();
                setRemoving(p);
              }}>
                Remove
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={removing !== null}
        title="Remove this photo?"
        confirmLabel="Remove photo"
        confirmVariant="danger"
        isLoading={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onCancel={() => setRemoving(null)}
        onConfirm={() =>
          removing &&
          remove.mutate(removing.id, {
            onSuccess: () => {
              setDone(`${describe(removing)} removed.`);
              setRemoving(null);
            },
          })
        }
      >
        For a photo taken by mistake. Once the stock is checked in, its photos stay as the record of what went out and came back.
      </ConfirmDialog>
    </>
  );
}
