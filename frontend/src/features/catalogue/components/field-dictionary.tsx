import { useId } from 'react';
import { ROLES, ROLE_LABELS } from '@toneledger/common/domain/roles';
import { readersOf, typeLabel, type FieldSpec } from '@toneledger/common/fields/field';

function Readers({ field }: { field: FieldSpec }) {
  const readers = readersOf(field);
  if (readers.length === ROLES.length) return <>Every role</>;
  return (
    <>
      <span className="font-medium">Restricted:</span> {readers.map((r) => ROLE_LABELS[r]).join(', ')}
    </>
  );
}

function TypeCell({ field }: { field: FieldSpec }) {
  const t = field.type;
  return (
    <>
      {typeLabel(t)}
      {t.kind === 'code' || t.kind === 'codes' ? (
        <details className="mt-1">
          <summary className="cursor-pointer text-xs text-ink-700">{t.codes.length} codes</summary>
          <ul className="mt-1 flex flex-col gap-0.5 text-xs">
            {t.codes.map((c) => (
              <li key={c}>
                <code className="mono">{c}</code> — {t.labels[c]}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </>
  );
}

function OnImport({ field }: { field: FieldSpec }) {
  if (field.importNote) return <>{field.importNote}</>;
  if (field.required) return <span className="font-medium">Required</span>;
  return <>Optional{field.default ? <>; empty: <code className="mono">{field.default}</code></> : null}</>;
}

/** One table of a field table: every field with its label, CSV column, type and codes, unit, import rule, readers, description and example. */
export function FieldDictionary({ title, fields, intro }: { title: string; fields: readonly FieldSpec[]; intro: string }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="flex flex-col gap-2">
      <h2 id={id} className="text-lg">
        {title}
      </h2>
      <p className="max-w-3xl text-sm text-ink-800">{intro}</p>
      <div className="overflow-x-auto rounded border border-paper-300 bg-white">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">{title}</caption>
          <thead className="bg-paper-100 text-xs text-ink-700 uppercase">
            <tr>
              <th scope="col" className="px-3 py-2">Field</th>
              <th scope="col" className="px-3 py-2">CSV column</th>
              <th scope="col" className="px-3 py-2">Type</th>
              <th scope="col" className="px-3 py-2">Unit</th>
              <th scope="col" className="px-3 py-2">On import</th>
              <th scope="col" className="px-3 py-2">Who may read it</th>
              <th scope="col" className="px-3 py-2">Description</th>
              <th scope="col" className="px-3 py-2">Example</th>
            </tr>
          </thead>
          <tbody>
            {fields.map((f) => (
              <tr key={f.column} className="border-t border-paper-200 align-top">
                <th scope="row" className="px-3 py-1.5 font-medium">
                  {f.label}
                </th>
                <td className="px-3 py-1.5">
                  <code className="mono text-xs">{f.column}</code>
                </td>
                <td className="px-3 py-1.5">
                  <TypeCell field={f} />
                </td>
                <td className="px-3 py-1.5">{f.unit ?? ''}</td>
                <td className="px-3 py-1.5">
                  <OnImport field={f} />
                </td>
                <td className="px-3 py-1.5">
                  <Readers field={f} />
                </td>
                <td className="px-3 py-1.5">{f.description}</td>
                <td className="px-3 py-1.5 break-words">{f.example ? <code className="mono text-xs">{f.example}</code> : null}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
