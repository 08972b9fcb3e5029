import type { FieldError, FieldValues, Path, UseFormSetError } from 'react-hook-form';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { isApiError } from '@/lib/api-client';

/**
 * The problems of a form, one message per field, keyed by the field's path as the contract writes it
 * (`title`, `steps.2.timeSeconds`, `observations.0.termCode`). `''` is the form as a whole.
 */
export type FieldErrors = Record<string, string>;

/** The key react-hook-form keeps a whole-form problem under. */
export const FORM_ERROR = 'root.form';

type AnyIssue = { path: string | readonly PropertyKey[]; message: string };

/**
 * Issues as field errors: zod's (path as an array) or the server envelope's (`details`, path as
 * dotted text). The first message per path wins, so each field shows one problem. `fieldFor` moves
 * an issue to the form field that shows it, where the form's names differ from the contract's.
 */
export function issuesToFieldErrors(issues: readonly AnyIssue[], fieldFor: (path: string) => string = (path) => path): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) {
    const path = typeof issue.path === 'string' ? issue.path : issue.path.map(String).join('.');
    const field = fieldFor(path);
    if (!(field in errors)) errors[field] = issue.message;
  }
  return errors;
}

/**
 * The field issues of a failed request (`ApiError.fieldIssues`: a `validation_failed`, or a 409 that
 * names the field that must be unique). An issue the envelope lists without its `code` still has a
 * field and a message, and is shown too; anything else in `details` (a stale edit's record) is not.
 */
export function fieldIssuesOf(error: unknown): Pick<FieldIssue, 'path' | 'message'>[] {
  if (!isApiError(error)) return [];
  if (error.fieldIssues.length > 0) return error.fieldIssues;
  if (!Array.isArray(error.details)) return [];
  return error.details.flatMap((item: unknown) => {
    const { path, message } = (typeof item === 'object' && item !== null ? item : {}) as { path?: unknown; message?: unknown };
    return typeof path === 'string' && typeof message === 'string' ? [{ path, message }] : [];
  });
}

/** The server's field issues as field errors, moved to the fields that show them. */
export function serverFieldErrors(issues: readonly Pick<FieldIssue, 'path' | 'message'>[], fieldFor?: (path: string) => string): FieldErrors {
  return issuesToFieldErrors(issues, fieldFor);
}

/** Puts field errors on a react-hook-form form; a whole-form problem goes under `root.form`. */
export function applyFieldErrors<V extends FieldValues>(setError: UseFormSetError<V>, errors: FieldErrors): void {
  for (const [path, message] of Object.entries(errors)) {
    setError((path === '' ? FORM_ERROR : path) as Path<V>, { type: 'server', message });
  }
}

function isLeaf(node: unknown): node is FieldError {
  if (typeof node !== 'object' || node === null) return false;
  const { type, message } = node as { type?: unknown; message?: unknown };
  return typeof type === 'string' || typeof message === 'string';
}

/**
 * react-hook-form's nested errors as one message per path, in the order found. An array's own
 * problem (kept as `root`) is reported at the array's path; a whole-form one at `''`.
 */
export function flattenFormErrors(errors: unknown, prefix = ''): FieldErrors {
  const out: FieldErrors = {};
  if (typeof errors !== 'object' || errors === null) return out;
  for (const [key, node] of Object.entries(errors as Record<string, unknown>)) {
    if (key === 'ref') continue;
    const path = key === 'root' ? prefix : prefix ? `${prefix}.${key}` : key;
    if (isLeaf(node)) {
      if (typeof node.message === 'string' && node.message !== '' && !(path in out)) out[path] = node.message;
      continue;
    }
    if (key === 'root' && prefix === '') {
      // root.form, root.server…: problems of the whole form.
      for (const child of Object.values(node as Record<string, unknown>)) {
        if (isLeaf(child) && typeof child.message === 'string' && !('' in out)) out[''] = child.message;
      }
      continue;
    }
    for (const [childPath, message] of Object.entries(flattenFormErrors(node, path))) if (!(childPath in out)) out[childPath] = message;
  }
  return out;
}
