import type { ReactNode } from 'react';
import { PageHeader } from './page-header';

/** The plain stand-in for a screen that is not built yet; each feature replaces its own. */
export function NotBuiltYet({ title, plannedFor }: { title: string; plannedFor: ReactNode }) {
  return (
    <div>
      <PageHeader title={title} />
      <div className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">
        <p className="font-medium text-ink">This screen is not built yet.</p>
        <p className="mt-1">It will hold: {plannedFor}</p>
      </div>
    </div>
  );
}
