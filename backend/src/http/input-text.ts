import type { FieldIssue } from '@toneledger/common/schemas/envelope';

/**
 * The one rule for text in a request: a string (or an object key) holding NUL or an unpaired UTF-16
 * surrogate is refused, never cleaned. PostgreSQL cannot store either (text refuses NUL; JSON for
 * the audit trail refuses both), and changing what a person typed without saying so loses data.
 * `mount()` runs this over the raw params, query and body of every endpoint before the contract's
 * schemas, so multipart text fields (parsed by the endpoint's `before` middleware) are checked too.
 */
export const NUL_MESSAGE = 'Remove the invisible control character (NUL) from this text';
export const BROKEN_MESSAGE = 'This text holds a broken character; type it again';

// A high surrogate not followed by a low one, or a low surrogate not preceded by a high one.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function problemOf(text: string): { message: string; code: string } | null {
  if (text.includes('\u0000')) return { message: NUL_MESSAGE, code: 'nul_character' };
  if (LONE_SURROGATE.test(text)) return { message: BROKEN_MESSAGE, code: 'broken_character' };
  return null;
}

/** A key as it can be shown in a path: its bad characters replaced, so the answer never echoes them. */
function shown(key: string): string {
  return key.replace(/\u0000/g, '\uFFFD').replace(new RegExp(LONE_SURROGATE.source, 'g'), '\uFFFD');
}

/**
 * Every string and key under `value` that breaks the rule, with its dotted path under `prefix`
 * (`''` for the body, `query`, `params`). Walks without recursion, so a deeply nested body cannot
 * exhaust the stack.
 */
export function textProblems(value: unknown, prefix: string): FieldIssue[] {
  const found: FieldIssue[] = [];
  const stack: Array<{ value: unknown; path: string[] }> = [{ value, path: prefix ? [prefix] : [] }];
  while (stack.length) {
    const { value: v, path } = stack.pop()!;
    if (typeof v === 'string') {
      const p = problemOf(v);
      if (p) found.push({ path: path.join('.'), ...p });
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], path: [...path, String(i)] });
    } else if (v !== null && typeof v === 'object' && !Buffer.isBuffer(v)) {
      const entries = Object.entries(v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [key, child] = entries[i]!;
        const keyPath = [...path, shown(key)];
        const p = problemOf(key);
        if (p) found.push({ path: keyPath.join('.'), ...p });
        else stack.push({ value: child, path: keyPath });
      }
    }
  }
  return found;
}
