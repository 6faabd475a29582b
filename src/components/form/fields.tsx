import { createContext, useContext, useEffect } from 'react';
import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from 'react';
import type { RegisterOptions } from 'react-hook-form';
import { Alert } from '../ui/alert';
import { Button } from '../ui/button';
import type { ButtonSize } from '../ui/button';
import type { SchemaForm } from './use-schema-form';

const FormContext = createContext<SchemaForm | null>(null);

/** The form around a field; for inputs a feature lays out itself (a table cell, a drawn list). */
export function useSchemaFormContext(): SchemaForm {
  const form = useContext(FormContext);
  if (!form) throw new Error('Form fields need a <Form> around them');
  return form;
}

interface FormProps {
  form: SchemaForm;
  /** The accessible name of the form, e.g. "Sign in". */
  label: string;
  children: ReactNode;
  className?: string;
  /** `search` for a list's search bar (a search landmark rather than a form). */
  role?: 'search';
}

export function Form({ form, label, children, className = 'space-y-5', role }: FormProps) {
  return (
    <FormContext.Provider value={form}>
      <form noValidate role={role} aria-label={label} onSubmit={(event) => void form.submit(event)} className={className}>
        <FormErrorArea />
        {children}
      </form>
    </FormContext.Provider>
  );
}

/** The form-level error area: what the server said that belongs to no single field. */
function FormErrorArea() {
  const { formError } = useSchemaFormContext();
  if (!formError) return null;
  return (
    <Alert tone="danger" title="That did not work">
      {formError}
    </Alert>
  );
}

export const inputClasses =
  'block w-full min-h-tap rounded-md border bg-white px-3 text-base text-ink-900 placeholder:text-ink-400 ' + 'aria-[invalid=true]:border-brick-600 aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-brick-600';

/** The ids of a field's input, hint and error, from the form's id and the field's path. */
export function fieldIds(form: Pick<SchemaForm, 'id'>, name: string) {
  const base = `${form.id}-${name.replace(/\W/g, '-')}`;
  return { input: base, hint: `${base}-hint`, error: `${base}-error` };
}

/** `aria-describedby` for a field: its hint, then its error, whichever it has. */
export function describedBy(ids: { hint: string; error: string }, hint: unknown, error: unknown): string | undefined {
  const list = [hint ? ids.hint : null, error ? ids.error : null].filter(Boolean);
  return list.length ? list.join(' ') : undefined;
}

/** A field's error, linked to its input by id. */
export function FieldMessage({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p id={id} className="mt-1.5 flex items-center gap-1.5 text-sm font-medium text-brick-700">
      <svg viewBox="0 0 24 24" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
        <path d="M12 7v6m0 4v.01" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      </svg>
      {children}
    </p>
  );
}

function FieldHint({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p id={id} className="mb-1.5 text-sm text-ink-600">
      {children}
    </p>
  );
}

/** Registers an input by its path, keeping the caller's own change and blur handlers. */
function useRegistered<E>(name: string, handlers: { onChange?: (event: E) => void; onBlur?: (event: E) => void }) {
  const form = useSchemaFormContext();
  const options: RegisterOptions = {};
  if (handlers.onChange) options.onChange = handlers.onChange as RegisterOptions['onChange'];
  if (handlers.onBlur) options.onBlur = handlers.onBlur as RegisterOptions['onBlur'];
  return { form, registered: form.register(name, options), error: form.fieldError(name), ids: fieldIds(form, name) };
}

/** The frame every text-like field shares: its label, its hint, the control, then its error. */
function FieldFrame({ ids, label, hint, error, className, children }: { ids: { input: string; hint: string; error: string }; label: string; hint?: ReactNode; error?: string; className: string; children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={ids.input} className="mb-1.5 block font-medium text-ink-900">
        {label}
      </label>
      {hint ? <FieldHint id={ids.hint}>{hint}</FieldHint> : null}
      {children}
      {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
    </div>
  );
}

interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'name' | 'id'> {
  name: string;
  label: string;
  hint?: ReactNode;
}

export function TextField({ name, label, hint, type = 'text', className = '', onChange, onBlur, ...rest }: TextFieldProps) {
  const { registered, error, ids } = useRegistered(name, { onChange, onBlur });
  return (
    <FieldFrame ids={ids} label={label} hint={hint} error={error} className={className}>
      <input
        id={ids.input}
        type={type}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint, error)}
        className={`${inputClasses} ${error ? 'border-brick-600' : 'border-ink-300'}`}
        {...rest}
        {...registered}
      />
    </FieldFrame>
  );
}

interface TextAreaFieldProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'name' | 'id'> {
  name: string;
  label: string;
  hint?: ReactNode;
}

export function TextAreaField({ name, label, hint, className = '', rows = 3, onChange, onBlur, ...rest }: TextAreaFieldProps) {
  const { registered, error, ids } = useRegistered(name, { onChange, onBlur });
  return (
    <FieldFrame ids={ids} label={label} hint={hint} error={error} className={className}>
      <textarea
        id={ids.input}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint, error)}
        className={`block w-full rounded-md border bg-white px-3 py-2 text-base text-ink-900 placeholder:text-ink-400 ${error ? 'border-brick-600 ring-1 ring-brick-600' : 'border-ink-300'}`}
        {...rest}
        {...registered}
      />
    </FieldFrame>
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

export function SelectField({ name, label, options, hint, className = '', onChange, onBlur, ...rest }: SelectFieldProps) {
  const { registered, error, ids } = useRegistered(name, { onChange, onBlur });
  return (
    <FieldFrame ids={ids} label={label} hint={hint} error={error} className={className}>
      <select
        id={ids.input}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint, error)}
        className={`${inputClasses} ${error ? 'border-brick-600' : 'border-ink-300'}`}
        {...rest}
        {...registered}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}

interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'name' | 'id' | 'type'> {
  name: string;
  label: ReactNode;
  hint?: ReactNode;
}

/** A tick box: "on" when ticked, left out when not, as the form schemas read it. */
export function CheckboxField({ name, label, hint, className = '', onChange, onBlur, ...rest }: CheckboxFieldProps) {
  const { registered, error, ids } = useRegistered(name, { onChange, onBlur });
  return (
    <div className={className}>
      <label htmlFor={ids.input} className="flex min-h-tap cursor-pointer items-center gap-3 font-medium">
        <input id={ids.input} type="checkbox" aria-invalid={error ? true : undefined} aria-describedby={describedBy(ids, hint, error)} className="h-5 w-5 accent-clay-600" {...rest} {...registered} />
        {label}
      </label>
      {hint ? <FieldHint id={ids.hint}>{hint}</FieldHint> : null}
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
  const { registered, error, ids } = useRegistered(name, {});
  return (
    // aria-invalid belongs on the radio group, not on each radio button.
    <fieldset role="radiogroup" aria-invalid={error ? true : undefined} aria-describedby={error ? ids.error : undefined}>
      <legend className="mb-1.5 font-medium text-ink-900">{legend}</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((option) => {
          const optionId = `${ids.input}-${option.value}`;
          return (
            <label key={option.value} htmlFor={optionId} className="flex min-h-tap cursor-pointer items-start gap-3 rounded-md border border-ink-300 bg-white p-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50">
              <input id={optionId} type="radio" value={option.value} defaultChecked={defaultValue === option.value} className="mt-1 h-5 w-5 accent-clay-600" {...registered} />
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

/**
 * The error of a group of inputs: registers the group's path so a schema or server error about the
 * whole group (not one input) lands here, and gives its message and the id to point at it.
 */
export function useFieldGroup(name: string): { error: string | undefined; errorId: string } {
  const form = useSchemaFormContext();
  const { addGroup } = form;
  useEffect(() => addGroup(name), [addGroup, name]);
  return { error: form.fieldError(name), errorId: fieldIds(form, name).error };
}

interface FieldGroupProps {
  name: string;
  legend: string;
  hint?: ReactNode;
  children: ReactNode;
  className?: string;
}

/** A fieldset whose own path can carry an error (a rule across its inputs), shown under its legend. */
export function FieldGroup({ name, legend, hint, children, className = 'rounded-md border border-mortar-300 p-3' }: FieldGroupProps) {
  const { error, errorId } = useFieldGroup(name);
  return (
    <fieldset aria-describedby={error ? errorId : undefined} className={className}>
      <legend className="px-1 font-medium text-ink-900">{legend}</legend>
      {hint ? <p className="mb-2 text-sm text-ink-600">{hint}</p> : null}
      {error ? <FieldMessage id={errorId}>{error}</FieldMessage> : null}
      {children}
    </fieldset>
  );
}

interface SubmitButtonProps {
  children: ReactNode;
  size?: ButtonSize;
  className?: string;
}

export function SubmitButton({ children, size = 'md', className = '' }: SubmitButtonProps) {
  const { submitting } = useSchemaFormContext();
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
