import { useEffect, useState, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { useController, useFormContext, useFormState, get } from 'react-hook-form';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useFieldSetup } from '@/components/form/form-context';

interface Common {
  /** The field's path in the form (and, unless the form says otherwise, in the contract). */
  name: string;
  label: string;
  hint?: string;
  fieldClassName?: string;
  /** A problem found as the person types (before any submit); a problem from the schema or the server comes first. */
  liveError?: string;
  /** The control's id, where the form needs to know it (focus after a move); otherwise one is made from the name. */
  id?: string;
}

type Native<T> = Omit<T, 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur' | 'id' | 'form'>;

/** What every bound control takes from the form: its id, name, value, error and the contract's limits. */
function useBound(name: string, label: string, given: { id?: string; hint?: string; fieldClassName?: string; liveError?: string }) {
  const setup = useFieldSetup(name);
  const { field, fieldState } = useController({ name });
  return {
    limits: setup.limits,
    onChange: field.onChange,
    props: {
      id: given.id ?? setup.id,
      label,
      hint: given.hint,
      fieldClassName: given.fieldClassName,
      error: fieldState.error?.message ?? given.liveError,
      name: field.name,
      value: (field.value as string | null | undefined) ?? '',
      onBlur: field.onBlur,
    },
  };
}

export interface TextInputProps extends Common, Native<InputHTMLAttributes<HTMLInputElement>> {
  /** Rewrites what is typed as it is typed (e.g. upper case for a currency code). */
  transform?: (text: string) => string;
}

/** A text box bound to a schema form: label, hint or error below, and the contract's length limit. */
export function TextInput({ name, id, label, hint, fieldClassName, liveError, transform, ...rest }: TextInputProps) {
  const { limits, onChange, props } = useBound(name, label, { id, hint, fieldClassName, liveError });
  return <TextField maxLength={limits.maxLength} {...rest} {...props} onChange={(event) => onChange(transform ? transform(event.target.value) : event.target.value)} />;
}

/** A number typed as text (the schema reads it): decimal keyboard, figures aligned. */
export function NumberInput({ className = '', ...props }: TextInputProps) {
  return <TextInput inputMode="decimal" className={`num ${className}`} autoComplete="off" {...props} />;
}

/** What a date control says when the browser holds a day the calendar does not have (typed 02/31/2024). */
export const NOT_A_CALENDAR_DAY = 'That day does not exist (for example 31 February): check the day and the month.';
const REAL_DATE = 'Enter a real date: day, month and year.';

/**
 * A calendar date. The browser shows it in the person's own format (mm/dd/yyyy, dd/mm/yyyy…) and
 * sends YYYY-MM-DD; a day the calendar lacks reaches the form as empty, so the control notices the
 * browser's "bad input" and says so in words that fit what the person sees, rather than asking for
 * YYYY-MM-DD or "Required".
 */
export function DateInput({ name, id, label, hint, fieldClassName, liveError, transform: _transform, ...rest }: TextInputProps) {
  const { onChange, props } = useBound(name, label, { id, hint, fieldClassName, liveError });
  const { setError } = useFormContext();
  const [badInput, setBadInput] = useState(false);
  const own = badInput ? NOT_A_CALENDAR_DAY : props.error?.includes('YYYY-MM-DD') ? REAL_DATE : undefined;
  // The schema's message is written for the API (YYYY-MM-DD, or "Required" for what reached it as
  // empty); the form's state takes this control's words, so the field and the summary say the same.
  useEffect(() => {
    if (props.error && own && props.error !== own) setError(name, { type: 'date', message: own });
  }, [props.error, own, name, setError]);
  const error = own ?? props.error;
  return (
    <TextField
      type="date"
      {...rest}
      {...props}
      error={error}
      onChange={(event) => {
        setBadInput(event.target.validity?.badInput === true);
        onChange(event.target.value);
      }}
      onBlur={(event) => {
        setBadInput(event.target.validity?.badInput === true);
        props.onBlur();
      }}
    />
  );
}

export interface TextAreaInputProps extends Common, Native<TextareaHTMLAttributes<HTMLTextAreaElement>> {}

/** Multi-line text bound to a schema form, with the contract's length limit. */
export function TextAreaInput({ name, id, label, hint, fieldClassName, liveError, ...rest }: TextAreaInputProps) {
  const { limits, onChange, props } = useBound(name, label, { id, hint, fieldClassName, liveError });
  return <TextAreaField maxLength={limits.maxLength} {...rest} {...props} onChange={(event) => onChange(event.target.value)} />;
}

export interface SelectInputProps extends Common, Native<SelectHTMLAttributes<HTMLSelectElement>> {
  /** The choices; an empty choice (when the field may be left empty) is given as a child or `empty`. */
  options?: readonly { value: string; label: string }[];
  /** The label of the empty choice ('' in the form), e.g. "Not recorded" or "Choose…". */
  empty?: string;
  /** Takes a choice in place of setting the field (a change that sets other fields too). */
  onChangeValue?: (value: string) => void;
  children?: ReactNode;
}

/** A choice bound to a schema form. Controlled, so a value whose option loads later still shows. */
export function SelectInput({ name, id, label, hint, fieldClassName, liveError, options, empty, onChangeValue, children, ...rest }: SelectInputProps) {
  const { onChange, props } = useBound(name, label, { id, hint, fieldClassName, liveError });
  return (
    <SelectField {...rest} {...props} onChange={(event) => (onChangeValue ? onChangeValue(event.target.value) : onChange(event.target.value))}>
      {empty !== undefined ? <option value="">{empty}</option> : null}
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {children}
    </SelectField>
  );
}

/** The message of a field or of a list (a list's own problem is kept as its `root`), for custom controls. */
export function useFieldError(name: string): string | undefined {
  const { control } = useFormContext();
  const { errors } = useFormState({ control, name });
  const node = get(errors, name) as { message?: string; root?: { message?: string } } | undefined;
  return node?.message ?? node?.root?.message;
}

export interface CheckboxInputProps extends Omit<Common, 'liveError'>, Native<InputHTMLAttributes<HTMLInputElement>> {}

/** A yes/no box bound to a schema form (the form holds a boolean), with its label beside it. */
export function CheckboxInput({ name, id, label, hint, fieldClassName = '', ...rest }: CheckboxInputProps) {
  const setup = useFieldSetup(name);
  const { field, fieldState } = useController({ name });
  const controlId = id ?? setup.id;
  const error = fieldState.error?.message;
  return (
    <div className={`flex flex-col gap-0.5 ${fieldClassName}`}>
      <label htmlFor={controlId} className="inline-flex items-center gap-2 text-sm">
        <input
          {...rest}
          id={controlId}
          type="checkbox"
          name={field.name}
          checked={field.value === true}
          onChange={(event) => field.onChange(event.target.checked)}
          onBlur={field.onBlur}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${controlId}-error` : hint ? `${controlId}-hint` : undefined}
        />
        {label}
      </label>
      {error ? (
        <p id={`${controlId}-error`} className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : hint ? (
        <p id={`${controlId}-hint`} className="text-xs text-ink-600">
          {hint}
        </p>
      ) : null}
    </div>
  );
}
