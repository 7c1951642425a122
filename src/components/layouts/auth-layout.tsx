import type { ReactNode } from 'react';
import { Wordmark } from '@/components/ui/wordmark';

/** The frame of the signed-out pages: a single card on paper. */
export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center justify-center px-4 py-10">
      <title>{`${title} · Lugbook`}</title>
      <main className="w-full max-w-md">
        <div className="mb-6 flex justify-center text-xl">
          <Wordmark />
        </div>
        <div className="rounded-lg border border-paper-edge bg-paper-bright p-6 shadow-sm sm:p-8">
          <h1 className="mb-5 text-xl font-semibold text-ink">{title}</h1>
          {children}
        </div>
        <p className="mt-6 text-center text-xs text-ink-soft">A lab notebook for guitar and bass electronics.</p>
      </main>
    </div>
  );
}
