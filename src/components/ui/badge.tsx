import type { ReactNode } from 'react';
import { cn } from '@/lib/format';

type Tone = 'neutral' | 'good' | 'warn' | 'bad' | 'info';

const tones: Record<Tone, string> = {
  neutral: 'bg-granite-100 text-granite-800',
  good: 'bg-spruce-400/15 text-spruce-700',
  warn: 'bg-signal-400/20 text-signal-700',
  bad: 'bg-alarm-500/10 text-alarm-600',
  info: 'bg-glacier-100 text-glacier-800',
};

export function Badge({ tone = 'neutral', children }: { tone?: Tone; children: ReactNode }) {
  return (
    <span className={cn('inline-flex items-center rounded px-2 py-0.5 text-xs font-medium', tones[tone])}>
      {children}
    </span>
  );
}
