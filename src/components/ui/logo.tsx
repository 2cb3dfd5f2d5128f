import { cn } from '@/lib/format';

/** The Stanceline mark: a shin over the snow line with the angle between them measured. */
export function LogoMark({ className, title = 'Stanceline' }: { className?: string; title?: string }) {
  return (
    <svg
      viewBox="0 0 64 64"
      className={cn('shrink-0', className)}
      {...(title ? { role: 'img', 'aria-label': title } : { 'aria-hidden': true })}
    >
      <rect width="64" height="64" rx="15" fill="#1c3a54" />
      <path d="M7 49 L57 38.5" stroke="#e1edf6" strokeWidth="4" strokeLinecap="round" />
      <path
        d="M34.8 42.8 A11 11 0 0 0 28.4 34.9"
        stroke="#5e9cc7"
        strokeWidth="3"
        fill="none"
        strokeLinecap="round"
      />
      <path
        d="M24 45 L34 22 L25 11"
        stroke="#f5b443"
        strokeWidth="5"
        strokeLinecap="round"
        strokeLinejoin="round"
        fill="none"
      />
      <circle cx="34" cy="22" r="4.5" fill="#1c3a54" stroke="#f5b443" strokeWidth="3" />
    </svg>
  );
}

export function Wordmark({ className, inverted }: { className?: string; inverted?: boolean }) {
  return (
    <span className={cn('inline-flex items-center gap-2.5', className)}>
      <LogoMark className="h-8 w-8" title="" />
      <span
        className={cn('text-lg font-semibold tracking-tight', inverted ? 'text-white' : 'text-glacier-900')}
      >
        Stance<span className={inverted ? 'text-signal-400' : 'text-glacier-500'}>line</span>
      </span>
    </span>
  );
}
