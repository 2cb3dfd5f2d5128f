import type { ReactNode } from 'react';
import { LogoMark } from '@/components/ui/logo';

/** The frame around the sign-in and invitation pages: name, mark, one line on what Stanceline does. */
export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center bg-glacier-950 px-4 py-10">
      <div className="w-full max-w-sm">
        <div className="mb-8 flex flex-col items-center text-center">
          <LogoMark className="h-14 w-14" />
          <p className="mt-3 text-2xl font-semibold tracking-tight text-white">
            Stance<span className="text-signal-400">line</span>
          </p>
          <p className="mt-2 text-sm text-glacier-200">
            Body angles from your training clips, turn by turn, for youth ski racing coaches and their
            athletes.
          </p>
        </div>
        <div className="rounded-lg bg-white p-6 shadow-xl">
          <h1 className="mb-5 text-lg font-semibold text-granite-900">{title}</h1>
          {children}
        </div>
      </div>
    </main>
  );
}
