import type { ReactNode } from 'react';

export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-canvas-300 bg-canvas-50 px-6 py-10 text-center">
      <p className="font-semibold text-canvas-800">{title}</p>
      {children ? <div className="mt-1 text-sm text-canvas-600">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
