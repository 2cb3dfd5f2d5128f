import type { ReactNode } from 'react';
import { CircleAlert, Info, TriangleAlert } from 'lucide-react';
import { cn } from '@/lib/format';

type Tone = 'caution' | 'info' | 'error';

const tones: Record<Tone, { box: string; icon: ReactNode }> = {
  caution: {
    box: 'border-signal-400 bg-signal-400/10 text-granite-900',
    icon: <TriangleAlert aria-hidden="true" className="h-5 w-5 shrink-0 text-signal-700" />,
  },
  info: {
    box: 'border-glacier-200 bg-glacier-50 text-granite-900',
    icon: <Info aria-hidden="true" className="h-5 w-5 shrink-0 text-glacier-600" />,
  },
  error: {
    box: 'border-alarm-500/50 bg-alarm-500/5 text-granite-900',
    icon: <CircleAlert aria-hidden="true" className="h-5 w-5 shrink-0 text-alarm-600" />,
  },
};

interface NoticeProps {
  tone?: Tone;
  title?: string;
  children: ReactNode;
  className?: string;
}

/** Cautions, hints and errors that stay on the page (toasts are for passing confirmations). */
export function Notice({ tone = 'info', title, children, className }: NoticeProps) {
  const style = tones[tone];
  return (
    <div
      role={tone === 'error' ? 'alert' : 'note'}
      className={cn('flex gap-3 rounded-md border-l-4 px-4 py-3 text-sm', style.box, className)}
    >
      {style.icon}
      <div>
        {title ? <p className="font-semibold">{title}</p> : null}
        <div className={title ? 'mt-0.5 text-granite-800' : 'text-granite-800'}>{children}</div>
      </div>
    </div>
  );
}
