import type { z } from 'zod';

/** What a field's schema allows: lengths of text, range of a number. */
export interface FieldLimits {
  maxLength?: number;
  minLength?: number;
  min?: number;
  max?: number;
}

type Def = { type: string; innerType?: Node; in?: Node; out?: Node; shape?: Record<string, Node>; element?: Node; getter?: () => Node };
type Node = { _zod: { def: Def }; maxLength?: number | null; minLength?: number | null; minValue?: number | null; maxValue?: number | null };

const WRAPPERS = new Set(['optional', 'nullable', 'default', 'prefault', 'readonly', 'catch', 'nonoptional', 'success']);

/** The schema inside optional/nullable/default wrappers and preprocess or transform pipes. */
function unwrap(node: Node): Node {
  let current = node;
  for (let depth = 0; depth < 20; depth += 1) {
    const def = current._zod.def;
    if (WRAPPERS.has(def.type) && def.innerType) current = def.innerType;
    else if (def.type === 'pipe' && def.in && def.out) current = def.out._zod.def.type === 'transform' ? def.in : def.out;
    else if (def.type === 'lazy' && def.getter) current = def.getter();
    else return current;
  }
  return current;
}

/** The schema of one field, by its dotted path (`steps.0.notes`, array indexes included); undefined when there is none. */
export function schemaAt(schema: z.ZodType, path: string): z.ZodType | undefined {
  let node = unwrap(schema as unknown as Node);
  for (const part of path.split('.').filter(Boolean)) {
    const def = node._zod.def;
    if (def.type === 'object' && def.shape) {
      const next = def.shape[part];
      if (!next) return undefined;
      node = unwrap(next);
    } else if (def.type === 'array' && def.element && /^\d+$/.test(part)) {
      node = unwrap(def.element);
    } else {
      return undefined;
    }
  }
  return node as unknown as z.ZodType;
}

const finite = (value: number | null | undefined) => (typeof value === 'number' && Number.isFinite(value) ? value : undefined);

/** The limits the contract sets on a field, so a form never writes them again. */
export function limitsOf(schema: z.ZodType, path: string): FieldLimits {
  const node = schemaAt(schema, path) as unknown as Node | undefined;
  if (!node) return {};
  const type = node._zod.def.type;
  if (type === 'string') return { maxLength: finite(node.maxLength), minLength: finite(node.minLength) };
  if (type === 'number') return { min: finite(node.minValue), max: finite(node.maxValue) };
  return {};
}
