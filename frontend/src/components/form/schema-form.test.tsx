import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { catalogueSettingsSchema, printInputSchema } from '@toneledger/common/schemas/catalogue';
import { reportInputSchema } from '@toneledger/common/schemas/condition';
import { NumberInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { ApiError } from '@/lib/api-client';
import { useSchemaForm } from '@/lib/forms/use-schema-form';

function ReportDates({ onValid }: { onValid: (body: unknown) => void }) {
  const form = useSchemaForm({
    schema: reportInputSchema,
    defaultValues: { examinedOn: '', context: 'routine', nextCheckOn: '' },
    toBody: (values: { examinedOn: string; context: string; nextCheckOn: string }) => ({ ...values, nextCheckOn: values.nextCheckOn || null }),
  });
  return (
    <SchemaForm form={form} onValid={onValid} aria-label="Dates">
      <TextInput name="examinedOn" label="Examined on" />
      <button type="submit">Save</button>
    </SchemaForm>
  );
}

function Settings({ onValid }: { onValid: (body: unknown) => void }) {
  const form = useSchemaForm({ schema: catalogueSettingsSchema, defaultValues: { accessionPattern: '', institutionName: '' } });
  return (
    <SchemaForm
      form={form}
      onValid={(body) => {
        onValid(body);
        form.serverError(new ApiError({ code: 'validation_failed', status: 400, message: 'Check', details: [{ path: 'institutionName', message: 'Too similar to the old name', code: 'custom' }] }));
      }}
      aria-label="Settings"
    >
      <TextInput name="institutionName" label="Institution name" />
      <TextInput name="accessionPattern" label="Accession-number pattern" />
      <button type="submit">Save</button>
    </SchemaForm>
  );
}

function Valuation() {
  const form = useSchemaForm({ schema: printInputSchema.pick({ valuationAmount: true }), defaultValues: { valuationAmount: '' } });
  return (
    <SchemaForm form={form} onValid={() => {}} aria-label="Valuation">
      <NumberInput name="valuationAmount" label="Valuation amount" />
      <button type="submit">Save</button>
    </SchemaForm>
  );
}

const summaryItems = () => within(screen.getByRole('alert')).getAllByRole('listitem').map((li) => li.textContent);
const errorOf = (input: HTMLElement) => document.getElementById(input.getAttribute('aria-describedby') ?? '')?.textContent ?? null;

describe('a schema form', () => {
  it('shows a date that does not exist once, in the product’s words, in the summary and at the field', async () => {
    const onValid = vi.fn();
    render(<ReportDates onValid={onValid} />);
    fireEvent.change(screen.getByLabelText('Examined on'), { target: { value: '2024-02-31' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(summaryItems()).toEqual(['Examined on: Enter a real date, as YYYY-MM-DD']));
    expect(errorOf(screen.getByLabelText('Examined on'))).toBe('Enter a real date, as YYYY-MM-DD');
    expect(screen.getAllByText('Enter a real date, as YYYY-MM-DD')).toHaveLength(1);
    expect(onValid).not.toHaveBeenCalled();
  });

  it('asks for empty required settings in plain words, and takes their length limits from the schema', async () => {
    render(<Settings onValid={() => {}} />);
    expect(screen.getByLabelText('Institution name').getAttribute('maxlength')).toBe('300');
    expect(screen.getByLabelText('Accession-number pattern').getAttribute('maxlength')).toBe('200');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(summaryItems()).toEqual(['Institution name: Required', 'Accession-number pattern: Required']));
    expect(screen.getByRole('alert').textContent).not.toMatch(/Too small|expected/);
  });

  it('asks for a number where a valuation is typed in words', async () => {
    render(<Valuation />);
    fireEvent.change(screen.getByLabelText('Valuation amount'), { target: { value: 'ten thousand' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(errorOf(screen.getByLabelText('Valuation amount'))).toBe('Enter a number'));
    expect(screen.queryByText(/NaN/)).toBeNull();
  });

  it('puts the server’s problem on its field, keeps what was typed, and clears it once the field is changed', async () => {
    const onValid = vi.fn();
    render(<Settings onValid={onValid} />);
    fireEvent.change(screen.getByLabelText('Institution name'), { target: { value: 'Fenwick Trust' } });
    fireEvent.change(screen.getByLabelText('Accession-number pattern'), { target: { value: 'YYYY.N' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    const name = screen.getByLabelText('Institution name');
    await waitFor(() => expect(errorOf(name)).toBe('Too similar to the old name'));
    expect((name as HTMLInputElement).value).toBe('Fenwick Trust');
    expect(document.activeElement).toBe(screen.getByRole('alert').parentElement);
    fireEvent.change(name, { target: { value: 'Fenwick Photographic Trust' } });
    await waitFor(() => expect(name.getAttribute('aria-invalid')).toBeNull());
    expect(screen.queryByRole('alert')).toBeNull();
    expect(onValid).toHaveBeenCalledWith({ institutionName: 'Fenwick Trust', accessionPattern: 'YYYY.N' });
  });
});
