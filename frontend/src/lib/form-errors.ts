/** Field errors of a form, keyed by the contract's field path (`title`, `observations.2.termCode`); `form` for the whole form. */
export type FieldErrors = Partial<Record<string, string>>;

/** A form's values checked with the shared schema: the body to send, or the errors to show. */
export type Checked<T> = { ok: true; data: T } | { ok: false; errors: FieldErrors };

/** zod issues as field errors: the first message per path. */
export function issuesToErrors(issues: readonly { path: readonly PropertyKey[]; message: string }[]): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) {
    const path = issue.path.map(String).join('.') || 'form';
    errors[path] ??= issue.message;
  }
  return errors;
}

/** The `details` of a server's validation or conflict error as field errors (anything unexpected is ignored). */
export function serverIssuesToErrors(details: unknown): FieldErrors {
  if (!Array.isArray(details)) return {};
  const errors: FieldErrors = {};
  for (const item of details) {
    if (typeof item !== 'object' || item === null) continue;
    const { path, message } = item as { path?: unknown; message?: unknown };
    if (typeof message !== 'string') continue;
    const key = typeof path === 'string' && path !== '' ? path : 'form';
    errors[key] ??= message;
  }
  return errors;
}
