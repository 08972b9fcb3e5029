import { useState } from 'react';
import { useWatch } from 'react-hook-form';
import { accessionRule, checkAccession } from '@toneledger/common/domain/accession';
import { catalogueSettingsSchema, printInputSchema, type CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { FieldErrors } from '@/lib/forms/field-errors';
import { limitsOf } from '@/lib/forms/limits';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useUpdateCatalogueSettings } from '@/features/reference/api/update-catalogue-settings';

/** What a pattern means, or why it is not a pattern. */
export function describePattern(pattern: string): { ok: true; describe: string; example: string } | { ok: false; error: string } {
  try {
    const rule = accessionRule(pattern.trim());
    return { ok: true, describe: rule.describe, example: rule.example };
  } catch (error) {
    return { ok: false, error: error instanceof Error ? error.message : String(error) };
  }
}

/** A pattern the catalogue cannot read is refused before it is sent. */
function check(values: CatalogueSettings): FieldErrors {
  const reading = describePattern(values.accessionPattern);
  return reading.ok || values.accessionPattern.trim() === '' ? {} : { accessionPattern: reading.error };
}

function PatternFields({ canManage }: { canManage: boolean }) {
  const pattern = useWatch<CatalogueSettings, 'accessionPattern'>({ name: 'accessionPattern' }) ?? '';
  const [tryValue, setTryValue] = useState('');
  const reading = describePattern(pattern);
  const hint = reading.ok ? `Reads as: ${reading.describe}${reading.example ? `. For example ${reading.example}` : ''}` : undefined;
  const result = tryValue.trim() ? checkAccession(pattern.trim(), tryValue) : null;
  return (
    <>
      <div className="flex flex-col gap-2">
        <TextInput
          name="accessionPattern"
          label="Accession-number pattern"
          hint={hint}
          liveError={reading.ok ? undefined : reading.error}
          readOnly={!canManage}
          className="mono"
          spellCheck={false}
          required
        />
        <details className="text-sm text-ink-700">
          <summary className="cursor-pointer font-medium text-iron-700">How patterns are written</summary>
          <ul className="mt-1 list-disc pl-5">
            <li>
              <code className="mono">YYYY</code> a four-digit year
            </li>
            <li>
              <code className="mono">N</code> a number of one or more digits
            </li>
            <li>
              <code className="mono">#</code> exactly one digit (<code className="mono">####</code> is four digits)
            </li>
            <li>
              <code className="mono">A</code> one capital letter
            </li>
            <li>
              <code className="mono">\x</code> the character x itself (to write a literal Y, N, A, # or \)
            </li>
            <li>Anything else stands for itself, e.g. full stops and hyphens.</li>
            <li>
              Or a regular expression after <code className="mono">re:</code>, matched against the whole number.
            </li>
          </ul>
        </details>
      </div>

      <div className="flex flex-col gap-2 rounded border border-paper-300 bg-paper-100 p-3">
        <TextField
          label="Try a number"
          hint="Checked against the pattern above as you type; nothing is saved."
          value={tryValue}
          onChange={(e) => setTryValue(e.target.value)}
          className="mono"
          spellCheck={false}
          fieldClassName="max-w-sm"
          maxLength={limitsOf(printInputSchema, 'accessionNumber').maxLength}
        />
        <div aria-live="polite">
          {result ? (
            result.ok ? (
              <p className="text-sm font-medium text-ok-700">
                <span aria-hidden="true">✓ </span>“{result.normalised}” fits the pattern.
              </p>
            ) : (
              <p className="text-sm font-medium text-danger-700">
                <span aria-hidden="true">✗ </span>
                {result.message}
              </p>
            )
          ) : null}
        </div>
      </div>
    </>
  );
}

export function CatalogueSettingsForm({ settings, canManage }: { settings: CatalogueSettings; canManage: boolean }) {
  const update = useUpdateCatalogueSettings();
  const form = useSchemaForm({ schema: catalogueSettingsSchema, defaultValues: settings, check });
  const [saved, setSaved] = useState(false);

  function onValid(body: CatalogueSettings) {
    setSaved(false);
    update.mutate(body, {
      onSuccess: (value) => {
        form.reset(value);
        setSaved(true);
      },
      onError: form.serverError,
    });
  }

  return (
    <SchemaForm form={form} onValid={onValid} className="max-w-3xl gap-5">
      <TextInput name="institutionName" label="Institution name" readOnly={!canManage} required />
      <PatternFields canManage={canManage} />
      {canManage ? (
        <div className="flex items-center gap-3">
          <Button type="submit" variant="primary" disabled={update.isPending}>
            Save
          </Button>
          <span role="status" className="text-sm text-ok-700">
            {update.isPending ? 'Saving…' : saved ? 'Settings saved.' : ''}
          </span>
        </div>
      ) : (
        <Notice tone="info">Only administrators change these settings.</Notice>
      )}
    </SchemaForm>
  );
}
