import type { z } from 'zod';
import { TextField, type TextFieldProps } from '@/components/ui/field';
import { limitsOf } from '@/lib/forms/limits';

export interface SearchFieldProps extends Omit<TextFieldProps, 'type' | 'value' | 'onChange' | 'maxLength'> {
  value: string;
  onText: (text: string) => void;
  /** The list query schema the text is sent in, as `q`; its length limit is the box's. */
  querySchema: z.ZodType;
}

/** The text box of a search form: a search input held to the length the list query allows. */
export function SearchField({ value, onText, querySchema, ...rest }: SearchFieldProps) {
  return <TextField type="search" value={value} onChange={(event) => onText(event.target.value)} maxLength={limitsOf(querySchema, 'q').maxLength} {...rest} />;
}
