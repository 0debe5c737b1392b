import { useId, type ComponentProps, type ReactNode } from 'react';
import { cn } from '@/lib/cn';

interface FieldShellProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  className?: string;
}

const controlClasses = (invalid: boolean) =>
  cn(
    'block w-full rounded-sm border bg-paper px-3 py-2 font-sans text-sm text-ink',
    invalid ? 'border-2 border-alert' : 'border-rule hover:border-ink-soft',
  );

function useFieldIds(id: string | undefined, hint: ReactNode, error: string | undefined) {
  const generated = useId();
  const controlId = id ?? generated;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const errorId = error ? `${controlId}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return { controlId, hintId, errorId, describedBy };
}

function FieldText({ hint, hintId, error, errorId }: { hint?: ReactNode; hintId?: string; error?: string; errorId?: string }) {
  return (
    <>
      {hint ? (
        <p id={hintId} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={errorId} className="mt-1 text-sm font-medium text-alert">
          {error}
        </p>
      ) : null}
    </>
  );
}

const labelClasses = 'mb-1 block text-sm font-semibold text-ink';

export function TextField({ label, hint, error, className, id, ...input }: FieldShellProps & ComponentProps<'input'>) {
  const ids = useFieldIds(id, hint, error);
  return (
    <div className={className}>
      <label htmlFor={ids.controlId} className={labelClasses}>
        {label}
      </label>
      <input
        id={ids.controlId}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={controlClasses(Boolean(error))}
        {...input}
      />
      <FieldText hint={hint} hintId={ids.hintId} error={error} errorId={ids.errorId} />
    </div>
  );
}

export function TextAreaField({ label, hint, error, className, id, ...textarea }: FieldShellProps & ComponentProps<'textarea'>) {
  const ids = useFieldIds(id, hint, error);
  return (
    <div className={className}>
      <label htmlFor={ids.controlId} className={labelClasses}>
        {label}
      </label>
      <textarea
        id={ids.controlId}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={cn(controlClasses(Boolean(error)), 'min-h-24')}
        {...textarea}
      />
      <FieldText hint={hint} hintId={ids.hintId} error={error} errorId={ids.errorId} />
    </div>
  );
}

export function SelectField({ label, hint, error, className, id, children, ...select }: FieldShellProps & ComponentProps<'select'>) {
  const ids = useFieldIds(id, hint, error);
  return (
    <div className={className}>
      <label htmlFor={ids.controlId} className={labelClasses}>
        {label}
      </label>
      <select
        id={ids.controlId}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={controlClasses(Boolean(error))}
        {...select}
      >
        {children}
      </select>
      <FieldText hint={hint} hintId={ids.hintId} error={error} errorId={ids.errorId} />
    </div>
  );
}

export function CheckboxField({ label, hint, error, className, id, ...input }: FieldShellProps & Omit<ComponentProps<'input'>, 'type'>) {
  const ids = useFieldIds(id, hint, error);
  return (
    <div className={className}>
      <div className="flex items-center gap-2">
        <input
          id={ids.controlId}
          type="checkbox"
          aria-invalid={error ? true : undefined}
          aria-describedby={ids.describedBy}
          className="size-4 accent-[var(--sl-brass)]"
          {...input}
        />
        <label htmlFor={ids.controlId} className="text-sm font-semibold text-ink">
          {label}
        </label>
      </div>
      <FieldText hint={hint} hintId={ids.hintId} error={error} errorId={ids.errorId} />
    </div>
  );
}

/** A group of related fields under a caption, such as a project's site. */
export function FieldGroup({ legend, children, className }: { legend: ReactNode; children: ReactNode; className?: string }) {
  return (
    <fieldset className={cn('rounded-sm border border-rule px-4 pt-2 pb-4', className)}>
      <legend className="px-1 font-serif text-base font-semibold text-ink">{legend}</legend>
      {children}
    </fieldset>
  );
}
