import { createContext, useContext } from 'react';
import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from 'react';
import { Alert } from '../ui/alert';
import { Button } from '../ui/button';
import type { ButtonSize } from '../ui/button';
import type { ZodForm } from './use-zod-form';

const FormContext = createContext<ZodForm | null>(null);

function useFormContext(): ZodForm {
  const form = useContext(FormContext);
  if (!form) throw new Error('Form fields need a <Form> around them');
  return form;
}

interface FormProps {
  form: ZodForm;
  /** The accessible name of the form, e.g. "Sign in". */
  label: string;
  children: ReactNode;
  className?: string;
}

export function Form({ form, label, children, className = 'space-y-5' }: FormProps) {
  return (
    <FormContext.Provider value={form}>
      <form noValidate aria-label={label} onSubmit={form.handleSubmit} className={className}>
        <FormErrorArea />
        {children}
      </form>
    </FormContext.Provider>
  );
}

/** The form-level error area: what the server said that belongs to no single field. */
function FormErrorArea() {
  const { formError } = useFormContext();
  if (!formError) return null;
  return (
    <Alert tone="danger" title="That did not work">
      {formError}
    </Alert>
  );
}

const inputClasses =
  'block w-full min-h-tap rounded-md border bg-white px-3 text-base text-ink-900 placeholder:text-ink-400 ' +
  'aria-[invalid=true]:border-brick-600 aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-brick-600';

function fieldIds(formId: string, name: string) {
  const base = `${formId}-${name.replace(/\W/g, '-')}`;
  return { input: base, hint: `${base}-hint`, error: `${base}-error` };
}

function describedBy(ids: { hint: string; error: string }, hint: unknown, error: unknown): string | undefined {
  const list = [hint ? ids.hint : null, error ? ids.error : null].filter(Boolean);
  return list.length ? list.join(' ') : undefined;
}

function FieldMessage({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p id={id} className="mt-1.5 flex items-center gap-1.5 text-sm font-medium text-brick-700">
      <svg viewBox="0 0 24 24" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
        <path d="M12 7v6m0 4v.01" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      </svg>
      {children}
    </p>
  );
}

interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'name' | 'id'> {
  name: string;
  label: string;
  hint?: ReactNode;
}

export function TextField({ name, label, hint, type = 'text', className = '', ...rest }: TextFieldProps) {
  const form = useFormContext();
  const ids = fieldIds(form.id, name);
  const error = form.fieldErrors[name];
  return (
    <div className={className}>
      <label htmlFor={ids.input} className="mb-1.5 block font-medium text-ink-900">
        {label}
      </label>
      {hint ? (
        <p id={ids.hint} className="mb-1.5 text-sm text-ink-600">
          {hint}
        </p>
      ) : null}
      <input
        id={ids.input}
        name={name}
        type={type}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint, error)}
        onInput={() => form.clearFieldError(name)}
        className={`${inputClasses} ${error ? 'border-brick-600' : 'border-ink-300'}`}
        {...rest}
      />
      {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
    </div>
  );
}

export interface ChoiceOption {
  value: string;
  label: string;
  description?: string;
}

interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'name' | 'id'> {
  name: string;
  label: string;
  options: readonly ChoiceOption[];
  hint?: ReactNode;
}

export function SelectField({ name, label, options, hint, className = '', ...rest }: SelectFieldProps) {
  const form = useFormContext();
  const ids = fieldIds(form.id, name);
  const error = form.fieldErrors[name];
  return (
    <div className={className}>
      <label htmlFor={ids.input} className="mb-1.5 block font-medium text-ink-900">
        {label}
      </label>
      {hint ? (
        <p id={ids.hint} className="mb-1.5 text-sm text-ink-600">
          {hint}
        </p>
      ) : null}
      <select
        id={ids.input}
        name={name}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint, error)}
        onChange={() => form.clearFieldError(name)}
        className={`${inputClasses} ${error ? 'border-brick-600' : 'border-ink-300'}`}
        {...rest}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
    </div>
  );
}

interface RadioGroupFieldProps {
  name: string;
  legend: string;
  options: readonly ChoiceOption[];
  defaultValue?: string;
}

export function RadioGroupField({ name, legend, options, defaultValue }: RadioGroupFieldProps) {
  const form = useFormContext();
  const ids = fieldIds(form.id, name);
  const error = form.fieldErrors[name];
  return (
    <fieldset role="radiogroup" aria-invalid={error ? true : undefined} aria-describedby={error ? ids.error : undefined}>
      <legend className="mb-1.5 font-medium text-ink-900">{legend}</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((option) => {
          const optionId = `${ids.input}-${option.value}`;
          return (
            <label
              key={option.value}
              htmlFor={optionId}
              className="flex min-h-tap cursor-pointer items-start gap-3 rounded-md border border-ink-300 bg-white p-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50"
            >
              <input
                id={optionId}
                type="radio"
                name={name}
                value={option.value}
                defaultChecked={defaultValue === option.value}
                onChange={() => form.clearFieldError(name)}
                className="mt-1 h-5 w-5 accent-clay-600"
              />
              <span>
                <span className="block font-medium">{option.label}</span>
                {option.description ? <span className="block text-sm text-ink-600">{option.description}</span> : null}
              </span>
            </label>
          );
        })}
      </div>
      {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
    </fieldset>
  );
}

interface SubmitButtonProps {
  children: ReactNode;
  size?: ButtonSize;
  className?: string;
}

export function SubmitButton({ children, size = 'md', className = '' }: SubmitButtonProps) {
  const { submitting } = useFormContext();
  return (
    <Button type="submit" size={size} busy={submitting} className={className}>
      {children}
    </Button>
  );
}

/** A "show password" switch, because typing a long password on a phone with gloves goes wrong. */
export function ShowPasswordToggle({ shown, onChange }: { shown: boolean; onChange: (shown: boolean) => void }) {
  return (
    <label className="inline-flex min-h-tap cursor-pointer items-center gap-2 text-sm font-medium text-ink-700">
      <input type="checkbox" checked={shown} onChange={(event) => onChange(event.target.checked)} className="h-5 w-5 accent-clay-600" />
      Show password
    </label>
  );
}
