import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const control =
  'w-full rounded-md border border-line bg-card px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-soft/60 aria-[invalid=true]:border-danger';

interface FieldProps {
  label: string;
  error?: string;
  hint?: ReactNode;
  mono?: boolean;
}

/** A labelled input with its error under it; the error is announced and linked by aria-describedby. */
export const TextField = forwardRef<HTMLInputElement, FieldProps & InputHTMLAttributes<HTMLInputElement>>(function TextField(
  { label, error, hint, mono, className = '', id, ...props },
  ref,
) {
  const autoId = useId();
  const inputId = id ?? autoId;
  return (
    <div className={className}>
      <label htmlFor={inputId} className="mb-1 block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      <input
        ref={ref}
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${inputId}-error` : undefined}
        className={`${control} ${mono ? 'num' : ''}`}
        {...props}
      />
      {hint && !error && <p className="mt-1 text-xs text-ink-soft">{hint}</p>}
      {error && <FieldError id={`${inputId}-error`}>{error}</FieldError>}
    </div>
  );
});

/** Options from a list of codes and their display names. */
export function optionsOf<C extends string>(codes: readonly C[], labels: Record<C, string>) {
  return codes.map((value) => ({ value, label: labels[value] }));
}

export const SelectField = forwardRef<HTMLSelectElement, FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { options?: readonly { value: string; label: string }[] }>(function SelectField(
  { label, error, hint, className = '', id, children, options, ...props },
  ref,
) {
  const autoId = useId();
  const selectId = id ?? autoId;
  return (
    <div className={className}>
      <label htmlFor={selectId} className="mb-1 block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      <select ref={ref} id={selectId} aria-invalid={error ? true : undefined} aria-describedby={error ? `${selectId}-error` : undefined} className={control} {...props}>
        {children}
        {options?.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {hint && !error && <p className="mt-1 text-xs text-ink-soft">{hint}</p>}
      {error && <FieldError id={`${selectId}-error`}>{error}</FieldError>}
    </div>
  );
});

export function FieldError({ id, children }: { id?: string; children: ReactNode }) {
  return (
    <p id={id} role="alert" className="mt-1 flex items-start gap-1 text-xs font-medium text-danger">
      <span aria-hidden="true">✕</span>
      {children}
    </p>
  );
}

/** The customer account a plan or job is for (staff choose; installers never see this). */
export const CustomerSelect = forwardRef<HTMLSelectElement, { customers: readonly { id: string; name: string }[]; error?: string } & SelectHTMLAttributes<HTMLSelectElement>>(function CustomerSelect({ customers, error, ...props }, ref) {
  return (
    <SelectField ref={ref} label="Customer account" error={error} {...props} options={customers.map((c) => ({ value: c.id, label: c.name }))}>
      <option value="">Choose a customer…</option>
    </SelectField>
  );
});
/** A labelled multi-line box (a scanner's Enter starts a new line instead of sending the form). */
export const TextAreaField = forwardRef<HTMLTextAreaElement, FieldProps & TextareaHTMLAttributes<HTMLTextAreaElement>>(function TextAreaField({ label, error, hint, mono, className = '', id, ...props }, ref) {
  const autoId = useId();
  const inputId = id ?? autoId;
  return (
    <Labelled id={inputId} label={label} error={error} hint={hint} className={className}>
      <textarea ref={ref} id={inputId} aria-invalid={error ? true : undefined} aria-describedby={error ? `${inputId}-error` : undefined} className={`${control} ${mono ? 'num' : ''}`} {...props} />
    </Labelled>
  );
});

/** The label above a control and its hint or error below. */
function Labelled({ id, label, error, hint, className, children }: { id: string; label: string; error?: string; hint?: ReactNode; className: string; children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      {children}
      {hint && !error && <p className="mt-1 text-xs text-ink-soft">{hint}</p>}
      {error && <FieldError id={`${id}-error`}>{error}</FieldError>}
    </div>
  );
}
