import { cn } from '@/lib/format';

interface ProgressBarProps {
  /** 0..1 */
  value: number;
  label: string;
  tone?: 'active' | 'done' | 'failed';
}

const tones = { active: 'bg-glacier-500', done: 'bg-spruce-500', failed: 'bg-alarm-500' };

export function ProgressBar({ value, label, tone = 'active' }: ProgressBarProps) {
  const percent = Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div
      role="progressbar"
      aria-label={label}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={percent}
      className="h-2 w-full overflow-hidden rounded-full bg-granite-100"
    >
      <div
        className={cn('h-full rounded-full transition-[width]', tones[tone])}
        style={{ width: `${percent}%` }}
      />
    </div>
  );
}
