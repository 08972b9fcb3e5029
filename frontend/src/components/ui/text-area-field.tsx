import { useId, type TextareaHTMLAttributes } from 'react';

export interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  hint?: string;
  error?: string;
  fieldClassName?: string;
}

/** A multi-line text field, laid out like TextField (label above, hint or error below). */
export function TextAreaField({ label, hint, error, fieldClassName = '', className = '', id, rows = 3, ...rest }: TextAreaFieldProps) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const describedBy = error ? `${inputId}-error` : hint ? `${inputId}-hint` : undefined;
  return (
    <div className={`flex flex-col gap-1 ${fieldClassName}`}>
      <label htmlFor={inputId} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
        {label}
      </label>
      <textarea
        id={inputId}
        rows={rows}
        className={`w-full rounded border border-paper-400 bg-white px-2.5 py-1.5 text-sm text-ink-900 placeholder:text-ink-600 aria-[invalid=true]:border-danger-700 ${className}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        {...rest}
      />
      {hint && !error ? (
        <p id={`${inputId}-hint`} className="text-xs text-ink-600">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${inputId}-error`} className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}
