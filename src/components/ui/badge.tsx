import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

export type BadgeTone = 'neutral' | 'positive' | 'caution' | 'negative';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-canvas-100 text-canvas-800 ring-canvas-300',
  positive: 'bg-pine-50 text-pine-800 ring-pine-200',
  caution: 'bg-ochre-50 text-ochre-800 ring-ochre-200',
  negative: 'bg-rust-50 text-rust-800 ring-rust-200',
};

export function Badge({ tone = 'neutral', children }: { tone?: BadgeTone; children: ReactNode }) {
  return <span className={cn('inline-flex items-center rounded-full px-2 py-0.5 text-xs font-semibold ring-1 ring-inset', tones[tone])}>{children}</span>;
}
