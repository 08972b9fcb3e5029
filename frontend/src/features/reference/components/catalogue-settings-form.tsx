import { useState, type FormEvent } from 'react';
import { accessionRule, checkAccession } from '@toneledger/common/domain/accession';
import { catalogueSettingsSchema, type CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { isApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useUpdateCatalogueSettings } from '@/features/reference/api/update-catalogue-settings';
import { errorsFromIssues, type FieldErrors } from '@/features/reference/components/use-record-form';

/** What a pattern means, or why it is not a pattern. */
export function describePattern(pattern: string): { ok: true; describe: string; example: string } | { ok: false; error: string } {
  try {
    const rule = accessionRule(pattern.trim());
    return { ok: true, describe: rule.describe, example: rule.example };
  } catch (error) {
    return { ok: false, error: error instanceof Error ? error.message : String(error) };
  }
}

export function CatalogueSettingsForm({ settings, canManage }: { settings: CatalogueSettings; canManage: boolean }) {
  const update = useUpdateCatalogueSettings();
  const [pattern, setPattern] = useState(settings.accessionPattern);
  const [institutionName, setInstitutionName] = useState(settings.institutionName);
  const [tryValue, setTryValue] = useState('');
  const [errors, setErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState(false);

  const reading = describePattern(pattern);
  const patternError = errors.accessionPattern ?? (reading.ok ? undefined : reading.error);
  const patternHint = reading.ok ? `Reads as: ${reading.describe}${reading.example ? `. For example ${reading.example}` : ''}` : undefined;
  const check = tryValue.trim() ? checkAccession(pattern.trim(), tryValue) : null;

  function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const parsed = catalogueSettingsSchema.safeParse({ accessionPattern: pattern, institutionName });
    const next: FieldErrors = parsed.success
      ? {}
      : errorsFromIssues(parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message })));
    if (!reading.ok && !next.accessionPattern) next.accessionPattern = reading.error;
    setErrors(next);
    if (!parsed.success || Object.keys(next).length > 0) return;
    update.mutate(parsed.data, {
      onSuccess: (value) => {
        setPattern(value.accessionPattern);
        setInstitutionName(value.institutionName);
        setSaved(true);
      },
      onError: (error) => {
        if (isApiError(error) && error.fieldIssues.length > 0) setErrors(errorsFromIssues(error.fieldIssues));
      },
    });
  }

  const otherError = update.isError && !(isApiError(update.error) && update.error.fieldIssues.length > 0) ? update.error.message : null;

  return (
    <form onSubmit={submit} noValidate className="flex max-w-3xl flex-col gap-5">
      <TextField
        label="Institution name"
        value={institutionName}
        onChange={(e) => {
          setInstitutionName(e.target.value);
          setErrors(({ institutionName: _drop, ...rest }) => rest);
        }}
        error={errors.institutionName}
        readOnly={!canManage}
        maxLength={300}
        required
      />

      <div className="flex flex-col gap-2">
        <TextField
          label="Accession-number pattern"
          value={pattern}
          onChange={(e) => {
            setPattern(e.target.value);
            setErrors(({ accessionPattern: _drop, ...rest }) => rest);
          }}
          hint={patternHint}
          error={patternError}
          readOnly={!canManage}
          className="mono"
          spellCheck={false}
          maxLength={200}
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
          maxLength={100}
        />
        <div aria-live="polite">
          {check ? (
            check.ok ? (
              <p className="text-sm font-medium text-ok-700">
                <span aria-hidden="true">✓ </span>“{check.normalised}” fits the pattern.
              </p>
            ) : (
              <p className="text-sm font-medium text-danger-700">
                <span aria-hidden="true">✗ </span>
                {check.message}
              </p>
            )
          ) : null}
        </div>
      </div>

      {canManage ? (
        <div className="flex flex-col gap-3">
          {otherError ? (
            <Notice tone="error" role="alert" title="Not saved.">
              <p>{otherError}</p>
            </Notice>
          ) : null}
          {Object.keys(errors).length > 0 ? (
            <Notice tone="error" role="alert" title="Not saved. Check the highlighted fields." />
          ) : null}
          <div className="flex items-center gap-3">
            <Button type="submit" variant="primary" disabled={update.isPending}>
              Save
            </Button>
            <span role="status" className="text-sm text-ok-700">
              {update.isPending ? 'Saving…' : saved ? 'Settings saved.' : ''}
            </span>
          </div>
        </div>
      ) : (
        <Notice tone="info">Only administrators change these settings.</Notice>
      )}
    </form>
  );
}
