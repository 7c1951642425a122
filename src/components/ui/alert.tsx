import type { ReactNode } from 'react';

type Tone = 'error' | 'success' | 'info';

const TONE: Record<Tone, string> = {
  error: 'border-fail/40 bg-fail-tint text-fail',
  success: 'border-pass/40 bg-pass-tint text-pass',
  info: 'border-accent/30 bg-accent-tint text-accent-strong',
};

/** A message at the top of a form or screen. Errors are announced at once (role="alert"). */
export function Alert({ tone = 'error', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-md border px-3 py-2 text-sm ${TONE[tone]}`}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? 'mt-0.5' : undefined}>{children}</div>}
    </div>
  );
}

/** Shown while a screen's data arrives. */
export function Loading({ what = 'Loading' }: { what?: string }) {
  return (
    <p role="status" className="py-6 text-sm text-ink-soft">
      {what}…
    </p>
  );
}
