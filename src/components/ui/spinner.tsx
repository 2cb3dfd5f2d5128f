import { cn } from '@/lib/format';

interface SpinnerProps {
  size?: 'sm' | 'md' | 'lg';
  /** Read by screen readers; pass "" when a surrounding element already says what is loading. */
  label?: string;
  className?: string;
}

const sizes = { sm: 'h-4 w-4 border-2', md: 'h-6 w-6 border-2', lg: 'h-10 w-10 border-[3px]' };

export function Spinner({ size = 'md', label = 'Loading', className }: SpinnerProps) {
  return (
    <span role={label ? 'status' : undefined} className={cn('inline-flex items-center', className)}>
      <span
        aria-hidden="true"
        className={cn('animate-spin rounded-full border-glacier-200 border-t-glacier-600', sizes[size])}
      />
      {label ? <span className="sr-only">{label}</span> : null}
    </span>
  );
}

export function PageSpinner({ label = 'Loading' }: { label?: string }) {
  return (
    <div className="flex min-h-48 items-center justify-center gap-3 text-sm text-granite-600">
      <Spinner label="" />
      <span role="status">{label}…</span>
    </div>
  );
}
