// Labelled form controls. Each control gets a real <label>, its hint and error are tied to it with
// aria-describedby, and an error sets aria-invalid so screen readers announce it.
import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const CONTROL =
  'block w-full rounded-md border bg-paper-bright px-3 py-2 text-base text-ink placeholder:text-ink-faint sm:text-sm ' +
  'focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent disabled:bg-paper-deep disabled:text-ink-soft';

const borderFor = (error?: string) => (error ? 'border-fail' : 'border-paper-edge');

interface FieldShellProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  className?: string;
  children: ReactNode;
}

function FieldShell({ id, label, hint, error, className, children }: FieldShellProps) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {hint && !error && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="mt-1 flex items-start gap-1 text-sm text-fail">
          <svg viewBox="0 0 16 16" className="mt-0.5 size-3.5 shrink-0" aria-hidden="true">
            <path d="M8 1.5 15 14.5H1z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
            <path d="M8 6v4M8 11.8v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          </svg>
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}

const describedBy = (id: string, hint: unknown, error: unknown) =>
  [error ? `${id}-error` : null, hint && !error ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;

interface CommonProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  /** Classes of the wrapper (label + control + messages). */
  className?: string;
}

export const TextField = forwardRef<
  HTMLInputElement,
  CommonProps & Omit<InputHTMLAttributes<HTMLInputElement>, 'className'> & { inputClassName?: string }
>(function TextField({ label, hint, error, className, inputClassName, id, ...rest }, ref) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
      <input
        ref={ref}
        id={fieldId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, hint, error)}
        className={`${CONTROL} ${borderFor(error)} read-only:bg-paper-deep read-only:text-ink-soft ${inputClassName ?? ''}`}
        {...rest}
      />
    </FieldShell>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, CommonProps & Omit<SelectHTMLAttributes<HTMLSelectElement>, 'className'>>(
  function SelectField({ label, hint, error, className, id, children, ...rest }, ref) {
    const auto = useId();
    const fieldId = id ?? auto;
    return (
      <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
        <select
          ref={ref}
          id={fieldId}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(fieldId, hint, error)}
          className={`${CONTROL} ${borderFor(error)}`}
          {...rest}
        >
          {children}
        </select>
      </FieldShell>
    );
  },
);

export const TextAreaField = forwardRef<HTMLTextAreaElement, CommonProps & Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'className'>>(
  function TextAreaField({ label, hint, error, className, id, ...rest }, ref) {
    const auto = useId();
    const fieldId = id ?? auto;
    return (
      <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
        <textarea
          ref={ref}
          id={fieldId}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(fieldId, hint, error)}
          className={`${CONTROL} ${borderFor(error)}`}
          rows={3}
          {...rest}
        />
      </FieldShell>
    );
  },
);
