import type { LightSettings } from '@toneledger/common/schemas/light';

/**
 * The SQL expression of a print's effective category (alias `p`): the override, else the first
 * rule that matches, else the fallback. Rule values are bound, never written into the text.
 */
export function categorySql(settings: LightSettings, bind: unknown[]): string {
  const arg = (v: unknown) => {
    bind.push(v);
    return `$${bind.length}`;
  };
  const whens = settings.rules.map((r) => {
    const conds = [
      r.process != null ? `p.process = ${arg(r.process)}` : null,
      r.tonerClass != null ? `${arg(r.tonerClass)}::text = ANY (p.toner_classes)` : null,
    ].filter(Boolean);
    return `WHEN ${conds.length ? conds.join(' AND ') : 'true'} THEN ${arg(r.category)}::text`;
  });
  const def = `CASE ${whens.join(' ')} ELSE ${arg(settings.fallbackCategory)}::text END`;
  return `coalesce(p.light_responsivity_override, ${def})`;
}
