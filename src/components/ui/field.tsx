import { useId, useState, type ComponentProps, type ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { PasswordStrength } from './password-strength';

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

/** What a Field hands its control so that the label names it and the hint and error describe it. */
export interface FieldControlProps {
  id: string;
  'aria-invalid'?: true;
  'aria-describedby'?: string;
}

/**
 * One labelled control with its hint and its error under it. The control is
 * drawn by `children` from the ids and ARIA attributes it is given, so one
 * wiring serves text boxes, selects, checkboxes and compound controls.
 * `inline` puts the control before its label on one line, as checkboxes are
 * read.
 */
export function Field({
  label,
  hint,
  error,
  className,
  id,
  inline = false,
  children,
}: {
  label: ReactNode;
  hint?: ReactNode;
  error?: ReactNode;
  className?: string;
  id?: string;
  inline?: boolean;
  children: (control: FieldControlProps) => ReactNode;
}) {
  const generated = useId();
  const controlId = id ?? generated;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const errorId = error ? `${controlId}-error` : undefined;
  const control = children({
    id: controlId,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': [hintId, errorId].filter(Boolean).join(' ') || undefined,
  });
  return (
    <div className={className}>
      {inline ? (
        <div className="flex items-center gap-2">
          {control}
          <label htmlFor={controlId} className="text-sm font-semibold text-ink">
            {label}
          </label>
        </div>
      ) : (
        <>
          <label htmlFor={controlId} className="mb-1 block text-sm font-semibold text-ink">
            {label}
          </label>
          {control}
        </>
      )}
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
    </div>
  );
}

export function TextField({ label, hint, error, className, id, ...input }: FieldShellProps & ComponentProps<'input'>) {
  return (
    <Field label={label} hint={hint} error={error} className={className} id={id}>
      {(control) => <input {...control} className={controlClasses(Boolean(error))} {...input} />}
    </Field>
  );
}

/**
 * A password box with a Show button at its end (ASVS 2.1.12): pressed, the
 * password reads as typed; pressed again, it is hidden. The button keeps one
 * name ("Show" and, for screen readers, the field's label) and tells its
 * state with aria-pressed; it is a plain button, so Tab reaches it and Space
 * or Enter presses it.
 *
 * `strength` puts a strength meter under a field where a new password is
 * chosen (PasswordStrength), given the account's own words (e-mail, name),
 * which make a password easy to guess.
 */
export function PasswordField({
  label,
  hint,
  error,
  className,
  id,
  strength,
  onChange,
  ...input
}: FieldShellProps & Omit<ComponentProps<'input'>, 'type'> & { strength?: { userInputs?: string[] } }) {
  const [shown, setShown] = useState(false);
  const [typed, setTyped] = useState('');
  return (
    <Field label={label} hint={hint} error={error} className={className} id={id}>
      {(control) => (
        <>
          <div className="flex">
            <input
              {...control}
              aria-describedby={[control['aria-describedby'], strength && `${control.id}-strength`].filter(Boolean).join(' ') || undefined}
              type={shown ? 'text' : 'password'}
              autoCapitalize="off"
              autoCorrect="off"
              spellCheck={false}
              className={cn(controlClasses(Boolean(error)), 'min-w-0 flex-1 rounded-r-none')}
              onChange={(e) => {
                if (strength) setTyped(e.target.value);
                onChange?.(e);
              }}
              {...input}
            />
            <button
              type="button"
              aria-pressed={shown}
              aria-controls={control.id}
              onClick={() => setShown((s) => !s)}
              className="shrink-0 rounded-r-sm border border-l-0 border-rule bg-paper px-3 font-sans text-sm font-medium text-brass hover:bg-paper-deep aria-pressed:border-brass-deep aria-pressed:bg-brass aria-pressed:text-paper aria-pressed:hover:bg-brass-deep"
            >
              Show<span className="sr-only"> {typeof label === 'string' ? label.toLowerCase() : 'password'}</span>
            </button>
          </div>
          {strength ? <PasswordStrength id={`${control.id}-strength`} password={typed} userInputs={strength.userInputs} /> : null}
        </>
      )}
    </Field>
  );
}

export function TextAreaField({ label, hint, error, className, id, ...textarea }: FieldShellProps & ComponentProps<'textarea'>) {
  return (
    <Field label={label} hint={hint} error={error} className={className} id={id}>
      {(control) => <textarea {...control} className={cn(controlClasses(Boolean(error)), 'min-h-24')} {...textarea} />}
    </Field>
  );
}

export function SelectField({ label, hint, error, className, id, children, ...select }: FieldShellProps & ComponentProps<'select'>) {
  return (
    <Field label={label} hint={hint} error={error} className={className} id={id}>
      {(control) => (
        <select {...control} className={controlClasses(Boolean(error))} {...select}>
          {children}
        </select>
      )}
    </Field>
  );
}

export function CheckboxField({ label, hint, error, className, id, ...input }: FieldShellProps & Omit<ComponentProps<'input'>, 'type'>) {
  return (
    <Field label={label} hint={hint} error={error} className={className} id={id} inline>
      {(control) => <input {...control} type="checkbox" className="size-4 accent-[var(--sl-brass)]" {...input} />}
    </Field>
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
