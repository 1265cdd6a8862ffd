import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

type FieldProps = { label: string; hint?: ReactNode; error?: string };

function FieldShell({ id, label, hint, error, children }: FieldProps & { id: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium">{label}</label>
      {children}
      {hint && !error ? <p id={`${id}-hint`} className="text-xs text-ink/70">{hint}</p> : null}
      {error ? (
        <p id={`${id}-error`} className="flex items-start gap-1 text-sm text-[#9a4a1c]" role="alert">
          <span aria-hidden>⚠</span>
          {error}
        </p>
      ) : null}
    </div>
  );
}

const control = 'rounded-md border bg-white px-3 py-2 text-sm text-ink placeholder:text-ink/45';
const border = (error?: string) => (error ? 'border-ember' : 'border-[#b7c3c9]');
const describedBy = (id: string, p: FieldProps) => (p.error ? `${id}-error` : p.hint ? `${id}-hint` : undefined);

export const TextField = forwardRef<HTMLInputElement, FieldProps & InputHTMLAttributes<HTMLInputElement>>(function TextField(
  { label, hint, error, className = '', ...rest },
  ref,
) {
  const id = useId();
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <input ref={ref} id={id} aria-invalid={!!error || undefined} aria-describedby={describedBy(id, { label, hint, error })} className={`${control} ${border(error)} ${className}`} {...rest} />
    </FieldShell>
  );
});

export const TextArea = forwardRef<HTMLTextAreaElement, FieldProps & TextareaHTMLAttributes<HTMLTextAreaElement>>(function TextArea(
  { label, hint, error, className = '', ...rest },
  ref,
) {
  const id = useId();
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <textarea ref={ref} id={id} aria-invalid={!!error || undefined} aria-describedby={describedBy(id, { label, hint, error })} className={`${control} ${border(error)} min-h-24 ${className}`} {...rest} />
    </FieldShell>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, FieldProps & SelectHTMLAttributes<HTMLSelectElement>>(function SelectField(
  { label, hint, error, className = '', children, ...rest },
  ref,
) {
  const id = useId();
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <select ref={ref} id={id} aria-invalid={!!error || undefined} aria-describedby={describedBy(id, { label, hint, error })} className={`${control} ${border(error)} ${className}`} {...rest}>
        {children}
      </select>
    </FieldShell>
  );
});

/** A message for the whole form (e.g. wrong password), announced to screen readers. */
export function FormAlert({ tone = 'error', children }: { tone?: 'error' | 'success' | 'info'; children: ReactNode }) {
  const look = {
    error: 'border-ember bg-[#fbeee5] text-[#7a3a14]',
    success: 'border-reed bg-[#eef4ef] text-[#2f4d35]',
    info: 'border-dusk/40 bg-white text-ink',
  }[tone];
  const icon = { error: '⚠', success: '✓', info: 'ℹ' }[tone];
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`flex gap-2 rounded-md border px-3 py-2 text-sm ${look}`}>
      <span aria-hidden>{icon}</span>
      <div>{children}</div>
    </div>
  );
}
