import { useController } from 'react-hook-form';
import { useFieldError } from '@/components/form/fields';
import { useFieldSetup } from '@/components/form/form-context';

export interface CheckGroupProps {
  /** The form field holding the chosen values (an array). */
  name: string;
  legend: string;
  options: readonly { value: string; label: string; count?: number }[];
  hint?: string;
  /** At most this many may be chosen (the others are disabled once reached). */
  max?: number;
}

/** Check boxes bound to a schema form: the field holds the checked values in the options' order. */
export function CheckGroup({ name, legend, options, hint, max }: CheckGroupProps) {
  const { id } = useFieldSetup(name);
  const { field } = useController({ name });
  // The list's own problem, or one of its first value (a code not in the vocabulary); both hooks run on every render.
  const listError = useFieldError(name);
  const firstError = useFieldError(`${name}.0`);
  const error = listError ?? firstError;
  const chosen = (field.value as string[] | undefined) ?? [];
  const toggle = (value: string, on: boolean) => {
    const next = new Set(chosen);
    if (on) next.add(value);
    else next.delete(value);
    field.onChange(options.map((o) => o.value).filter((v) => next.has(v)));
  };
  return (
    <fieldset id={id} tabIndex={-1} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} className="flex flex-col gap-1">
      <legend className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{legend}</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {options.map((o) => {
          const on = chosen.includes(o.value);
          return (
            <label key={o.value} className="inline-flex items-center gap-1.5 text-sm">
              <input type="checkbox" checked={on} disabled={!on && max !== undefined && chosen.length >= max} onChange={(e) => toggle(o.value, e.target.checked)} onBlur={field.onBlur} />
              {o.label}
              {o.count !== undefined ? <span className="num text-xs text-ink-600">({o.count})</span> : null}
            </label>
          );
        })}
      </div>
      {hint && !error ? <p className="text-xs text-ink-600">{hint}</p> : null}
      {error ? (
        <p id={`${id}-error`} className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
