import { createContext, useContext } from 'react';
import type { z } from 'zod';
import { limitsOf, type FieldLimits } from '@/lib/forms/limits';

export interface SchemaFormContextValue {
  /** Prefix of the ids of this form's controls, so the summary can link to them. */
  idPrefix: string;
  schema: z.ZodType;
  /** Maps a form field to the contract's path, where the two differ (for its limits). */
  schemaPath?: (name: string) => string;
}

export const SchemaFormContext = createContext<SchemaFormContextValue | null>(null);

/** The id of a field's control in the current form. */
export function fieldId(prefix: string, name: string): string {
  return `${prefix}-${name.replace(/\./g, '-')}`;
}

/** A field's id and the limits the contract sets on it. */
export function useFieldSetup(name: string): { id: string; limits: FieldLimits } {
  const context = useContext(SchemaFormContext);
  if (!context) throw new Error(`The field "${name}" is not inside a SchemaForm.`);
  const path = context.schemaPath ? context.schemaPath(name) : name;
  return { id: fieldId(context.idPrefix, name), limits: limitsOf(context.schema, path) };
}

/** The id a field of the current form has, for descriptions that point at it. */
export function useFieldId(name: string): string {
  const context = useContext(SchemaFormContext);
  return fieldId(context?.idPrefix ?? 'form', name);
}
