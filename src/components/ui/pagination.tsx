import { Button } from './button';

/** Previous/next paging with "Page 2 of 5"; hidden when everything fits on one page. */
export function Pagination({ page, pageSize, total, onPageChange, label = 'Pages' }: { page: number; pageSize: number; total: number; onPageChange: (page: number) => void; label?: string }) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (total <= pageSize) return null;
  return (
    <nav aria-label={label} className="mt-4 flex items-center justify-between gap-4 text-sm">
      <Button variant="secondary" size="sm" onClick={() => onPageChange(page - 1)} disabled={page <= 1}>
        Previous page
      </Button>
      <p aria-live="polite">
        Page {page} of {pages}
      </p>
      <Button variant="secondary" size="sm" onClick={() => onPageChange(page + 1)} disabled={page >= pages}>
        Next page
      </Button>
    </nav>
  );
}
