import { useId } from 'react';
import { GRADES, GRADE_LABELS, type Grade, type GradeDefinitions } from '@toneledger/common/schemas/condition';

export interface GradeFieldProps {
  value: '' | Grade;
  onChange: (grade: '' | Grade) => void;
  definitions: GradeDefinitions;
  error?: string;
  id?: string;
  /** The form field it stands for, so an error summary can link to it. */
  name?: string;
}

/** The overall grade: one radio per level, each with its written definition beside it. */
export function GradeField({ value, onChange, definitions, error, id, name }: GradeFieldProps) {
  const uid = useId();
  const legendId = `${uid}-legend`;
  const errorId = `${uid}-error`;
  return (
    <div
      id={id}
      data-field={name}
      role="radiogroup"
      aria-labelledby={legendId}
      aria-describedby={error ? errorId : undefined}
      aria-invalid={error ? true : undefined}
      tabIndex={-1}
      className="flex flex-col gap-2 outline-none"
    >
      <p id={legendId} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
        Overall grade
      </p>
      {GRADES.map((grade) => {
        const inputId = `${uid}-${grade}`;
        return (
          <div
            key={grade}
            className={`grid grid-cols-[auto_7rem_1fr] items-start gap-2 rounded border px-3 py-2 text-sm ${
              value === grade ? 'border-iron-600 bg-iron-50' : 'border-paper-300 bg-white'
            }`}
          >
            <input
              id={inputId}
              type="radio"
              name={`${uid}-grade`}
              value={grade}
              checked={value === grade}
              onChange={() => onChange(grade)}
              aria-describedby={`${inputId}-definition`}
              className="mt-1"
            />
            <label htmlFor={inputId} className="font-semibold">
              {GRADE_LABELS[grade]}
            </label>
            <p id={`${inputId}-definition`} className="text-ink-800">
              {definitions[grade]}
            </p>
          </div>
        );
      })}
      <label className="flex items-center gap-2 px-3 text-sm text-ink-800">
        <input type="radio" name={`${uid}-grade`} value="" checked={value === ''} onChange={() => onChange('')} />
        Not graded yet (a grade is needed to sign)
      </label>
      {error ? (
        <p id={errorId} className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}
