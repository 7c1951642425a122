import type { ReactNode } from 'react';

/** The screen's heading; also sets the browser tab's title (React 19 hoists <title> into <head>). */
export function PageHeader({
  title,
  documentTitle,
  description,
  actions,
}: {
  title: ReactNode;
  documentTitle?: string;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  const tab = documentTitle ?? (typeof title === 'string' ? title : null);
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-paper-edge pb-4">
      {tab && <title>{`${tab} · Lugbook`}</title>}
      <div className="min-w-0">
        <h1 className="text-2xl font-semibold tracking-tight text-ink">{title}</h1>
        {description && <p className="mt-1 max-w-prose text-sm text-ink-soft">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap items-center gap-2">{actions}</div>}
    </header>
  );
}

/** A titled block of a screen (panel on paper). */
export function Panel({
  title,
  id,
  actions,
  children,
  className,
}: {
  title?: ReactNode;
  id?: string;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  const headingId = id ? `${id}-heading` : undefined;
  return (
    <section
      id={id}
      aria-labelledby={headingId}
      className={`rounded-lg border border-paper-edge bg-paper-bright p-4 sm:p-5 ${className ?? ''}`}
    >
      {(title || actions) && (
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          {title && (
            <h2 id={headingId} className="text-base font-semibold text-ink">
              {title}
            </h2>
          )}
          {actions}
        </div>
      )}
      {children}
    </section>
  );
}
