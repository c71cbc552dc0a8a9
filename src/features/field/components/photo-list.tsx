import { PHOTO_STAGE_LABELS, type PhotoRow } from '@shared/schemas/field';
import { formatDateTime } from '@/lib/format';

/** Photos as thumbnails; each opens full size. They are served as images only (nosniff). */
export function PhotoList({ photos, empty = 'No photos yet.' }: { photos: PhotoRow[]; empty?: string }) {
  if (!photos.length) return <p className="text-sm text-canvas-600">{empty}</p>;
  return (
    <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
      {photos.map((p) => {
        const alt = `${PHOTO_STAGE_LABELS[p.stage]} photo${p.caption ? `: ${p.caption}` : ''}`;
        return (
          <li key={p.id} className="text-xs text-canvas-700">
            <a href={p.url} target="_blank" rel="noopener" className="block overflow-hidden rounded-md border border-canvas-200 bg-canvas-100">
              <img src={p.url} alt={alt} loading="lazy" className="aspect-square w-full object-cover" />
            </a>
            <p className="mt-1 font-semibold">{p.caption || PHOTO_STAGE_LABELS[p.stage]}</p>
            <p>
              {p.uploadedBy}, {formatDateTime(p.createdAt)}
            </p>
          </li>
        );
      })}
    </ul>
  );
}
