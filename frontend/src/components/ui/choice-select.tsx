import { SelectField, type SelectFieldProps } from '@/components/ui/field';

export interface ChoiceSelectProps extends Omit<SelectFieldProps, 'value' | 'onChange' | 'children'> {
  /** The choices: a vocabulary's `options` from `common/src/schemas/vocab.ts`, or records mapped to `{ value, label }`. */
  options: readonly { value: string; label: string }[] | undefined;
  /** The label of the first, empty choice, e.g. "Any process". */
  empty: string;
  /** The chosen value; undefined shows the empty choice. */
  value: string | undefined;
  /** The new choice, undefined for the empty one. */
  onChoose: (value: string | undefined) => void;
}

/** A filter's choice: an empty first option ("Any …"), then the list's options. */
export function ChoiceSelect({ options, empty, value, onChoose, ...rest }: ChoiceSelectProps) {
  return (
    <SelectField {...rest} value={value ?? ''} onChange={(event) => onChoose(event.target.value || undefined)}>
      <option value="">{empty}</option>
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </SelectField>
  );
}
