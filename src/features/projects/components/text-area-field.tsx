import type { TextareaHTMLAttributes } from 'react';
import type { ZodForm } from '../../../components/form/use-zod-form';

interface TextAreaFieldProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'name' | 'id' | 'form'> {
  form: ZodForm;
  name: string;
  label: string;
  hint?: string;
}

/**
 * A multi-line field that takes part in the shared form pattern (read on submit, errors by name).
 * TODO: move into components/form/form.tsx beside TextField when that file next changes.
 */
export function TextAreaField({ form, name, label, hint, className = '', rows = 3, ...rest }: TextAreaFieldProps) {
  const base = `${form.id}-${name.replace(/\W/g, '-')}`;
  const error = form.fieldErrors[name];
  const described = [hint ? `${base}-hint` : null, error ? `${base}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={className}>
      <label htmlFor={base} className="mb-1.5 block font-medium text-ink-900">
        {label}
      </label>
      {hint ? (
        <p id={`${base}-hint`} className="mb-1.5 text-sm text-ink-600">
          {hint}
        </p>
      ) : null}
      <textarea
        id={base}
        name={name}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={described}
        onInput={() => form.clearFieldError(name)}
        className={`block w-full rounded-md border bg-white px-3 py-2 text-base text-ink-900 placeholder:text-ink-400 ${
          error ? 'border-brick-600 ring-1 ring-brick-600' : 'border-ink-300'
        }`}
        {...rest}
      />
      {error ? (
        <p id={`${base}-error`} className="mt-1.5 text-sm font-medium text-brick-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}
