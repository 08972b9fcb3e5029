import { useController } from 'react-hook-form';
import { WEEKDAY_LABELS, WEEKDAYS } from '@toneledger/common/schemas/exhibitions';
import { useFieldError } from '@/components/form/fields';
import { useFieldId } from '@/components/form/form-context';

const FULL: Record<number, string> = { 1: 'Monday', 2: 'Tuesday', 3: 'Wednesday', 4: 'Thursday', 5: 'Friday', 6: 'Saturday', 7: 'Sunday' };

/** The days of the week a room is open, one toggle each, bound to a schema form's list of ISO weekdays. */
export function WeekdayToggles({ name, label }: { name: string; label: string }) {
  const { field } = useController({ name });
  const error = useFieldError(name);
  const id = useFieldId(name);
  const days = (field.value as number[] | undefined) ?? [];
  const toggle = (day: number) => field.onChange(days.includes(day) ? days.filter((d) => d !== day) : [...days, day]);
  return (
    <div className="flex flex-col gap-1">
      <span id={`${id}-label`} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
        {label}
      </span>
      <div
        id={id}
        role="group"
        aria-labelledby={`${id}-label`}
        aria-describedby={error ? `${id}-error` : undefined}
        tabIndex={-1}
        className="flex overflow-hidden rounded border border-paper-400"
      >
        {WEEKDAYS.map((day) => (
          <button
            key={day}
            type="button"
            aria-pressed={days.includes(day)}
            aria-label={FULL[day]}
            onClick={() => toggle(day)}
            className={`h-9 flex-1 px-2 text-sm ${days.includes(day) ? 'bg-iron-800 text-paper-50' : 'bg-white text-ink-800 hover:bg-paper-100'}`}
          >
            {WEEKDAY_LABELS[day]}
          </button>
        ))}
      </div>
      {error ? (
        <p id={`${id}-error`} className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}
