import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { makeRecipe } from '@/features/reference/testing/fixtures';
import { PRECEDENCE_NOTE } from '@/features/reference/components/recipe-cautions';
import { RecipePage } from '@/features/reference/routes/recipe-page';

const recipe = makeRecipe();

function renderRecipe(path: string, role: Parameters<typeof makeMe>[0] = 'registrar') {
  return renderRoutes([{ path: '/catalogue/recipes/:id', element: <RecipePage /> }], { path, me: makeMe(role) });
}

function type(field: HTMLElement, value: string) {
  fireEvent.change(field, { target: { value } });
}

/** The cells of one chemical's row in a table, as text. */
function cellsOf(table: HTMLElement, chemical: string): string[] {
  const row = within(table).getByRole('row', { name: new RegExp(`^${chemical}`) });
  return within(row).getAllByRole('cell').map((cell) => cell.textContent ?? '');
}

function ingredient(n: number) {
  return within(screen.getByRole('group', { name: `Ingredient ${n}` }));
}

describe('RecipePage: new recipe', () => {
  it('normalises the recipe live as it is typed, and shows the ferricyanide caution once it is named', async () => {
    const { requests } = mockFetch({});
    renderRecipe('/catalogue/recipes/new');

    type(screen.getByLabelText('Name'), 'Iron blue, single bath');
    type(screen.getByLabelText('Final volume (ml)'), '500');
    type(ingredient(1).getByLabelText('Chemical'), 'Ferric ammonium citrate');
    type(ingredient(1).getByLabelText('Amount'), '4');
    expect(screen.queryByText(/Contains a ferricyanide/)).toBeNull();

    fireEvent.click(screen.getByRole('button', { name: 'Add ingredient' }));
    type(ingredient(2).getByLabelText('Chemical'), 'Potassium ferricyanide');
    type(ingredient(2).getByLabelText('Amount'), '4');
    fireEvent.click(screen.getByRole('button', { name: 'Add ingredient' }));
    type(ingredient(3).getByLabelText('Chemical'), 'Acetic acid');
    type(ingredient(3).getByLabelText('Amount'), '130');
    expect(ingredient(3).getByLabelText<HTMLSelectElement>('Unit').value).toBe('g');
    type(ingredient(3).getByLabelText('Strength (%)'), '28');

    const preview = screen.getByRole('table', { name: 'Preview: ingredients per litre of working bath' });
    // given as, weighed g/L, measured ml/L, pure substance g/L
    expect(cellsOf(preview, 'Ferric ammonium citrate')).toEqual(['4 g', '8', '—', '8']);
    expect(cellsOf(preview, 'Potassium ferricyanide')).toEqual(['4 g', '8', '—', '8']);
    expect(cellsOf(preview, 'Acetic acid')).toEqual(['130 g of 28 % solution', '260', '—', '72.8']);

    const cautions = screen.getByRole('region', { name: /Safety cautions/ });
    expect(within(cautions).getByText(/Contains a ferricyanide: never mix it with strong acids or heat it/)).toBeTruthy();
    expect(within(cautions).getByText(/Always add acid to water/)).toBeTruthy();
    expect(cautions.textContent).toContain(PRECEDENCE_NOTE);

    // The preview follows a change of volume at once.
    type(screen.getByLabelText('Final volume (ml)'), '1000');
    expect(cellsOf(preview, 'Acetic acid')).toEqual(['130 g of 28 % solution', '130', '—', '36.4']);
    expect(requests).toHaveLength(0);
  });

  it('saves the whole recipe with numbers, then shows the saved recipe', async () => {
    const created = makeRecipe({ id: '55555555-5555-4555-8555-555555555555', name: 'Selenium 1+9', tonerClass: 'selenium', stepCount: 0 });
    const { requests } = mockFetch({ 'POST /api/recipes': () => json({ data: created }, 201) });
    const { router } = renderRecipe('/catalogue/recipes/new');

    type(screen.getByLabelText('Name'), 'Selenium 1+9');
    fireEvent.change(screen.getByLabelText('Toner'), { target: { value: 'selenium' } });
    type(screen.getByLabelText('Final volume (ml)'), '1000');
    type(ingredient(1).getByLabelText('Chemical'), 'Selenium toner concentrate');
    type(ingredient(1).getByLabelText('Amount'), '100');
    fireEvent.change(ingredient(1).getByLabelText('Unit'), { target: { value: 'ml' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    await waitFor(() => expect(router.state.location.pathname).toBe(`/catalogue/recipes/${created.id}`));
    expect(requests[0]?.body).toEqual({
      name: 'Selenium 1+9',
      tonerClass: 'selenium',
      volumeMl: 1000,
      ingredients: [{ chemical: 'Selenium toner concentrate', amount: 100, unit: 'ml', strengthPercent: null, densityGPerMl: null }],
      mixingNotes: null,
    });
    expect(await screen.findByText('Recipe added.')).toBeTruthy();
    expect(screen.getByRole('heading', { level: 1, name: 'Selenium 1+9' })).toBeTruthy();
  });

  it('checks the form before sending and keeps what was typed', async () => {
    const { requests } = mockFetch({});
    renderRecipe('/catalogue/recipes/new');
    type(ingredient(1).getByLabelText('Chemical'), 'Sodium sulfide');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(screen.getByLabelText('Name').getAttribute('aria-invalid')).toBe('true'));
    expect(requests).toHaveLength(0);
    expect(ingredient(1).getByLabelText('Amount').getAttribute('aria-invalid')).toBe('true');
    expect(ingredient(1).getByLabelText<HTMLInputElement>('Chemical').value).toBe('Sodium sulfide');
    expect(screen.getByRole('alert').textContent).toContain('Ingredient 1, amount');
  });

  it('asks people who cannot write to leave recipes to registrars', () => {
    mockFetch({});
    renderRecipe('/catalogue/recipes/new', 'researcher');
    expect(screen.queryByRole('button', { name: 'Save' })).toBeNull();
    expect(screen.getByText('Only registrars and administrators add recipes.')).toBeTruthy();
  });
});

describe('RecipePage: a stored recipe', () => {
  it('shows the server’s cautions first, with the precedence of safety data sheets and local rules', async () => {
    mockFetch({ [`GET /api/recipes/${recipe.id}`]: () => json({ data: recipe }) });
    renderRecipe(`/catalogue/recipes/${recipe.id}`, 'researcher');
    const cautions = await screen.findByRole('region', { name: /Safety cautions/ });
    expect(cautions.textContent).toContain('Contains a ferricyanide: never mix it with strong acids or heat it.');
    expect(cautions.textContent).toContain('safety data sheets, local regulations and your institution');
    // The cautions come before the ingredients.
    const ingredients = screen.getByRole('heading', { name: 'Ingredients for 500 ml' });
    expect(cautions.compareDocumentPosition(ingredients) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
    const perLitre = screen.getByRole('table', { name: 'Ingredients per litre of working bath' });
    expect(cellsOf(perLitre, 'Acetic acid')).toEqual(['130 g of 28 % solution', '260', '—', '72.8']);
    expect(screen.getByText('5 process steps')).toBeTruthy();
    // Strength shows what the solution is, and each ingredient its hazards, marked as recalled.
    const stated = screen.getByRole('table', { name: 'Ingredients as stated' });
    expect(cellsOf(stated, 'Acetic acid')[2]).toBe('28 % solution');
    expect(cellsOf(stated, 'Potassium ferricyanide')[2]).toBe('pure');
    const hazards = screen.getByRole('region', { name: 'Hazards of the ingredients' });
    expect(hazards.textContent).toContain('H314 Causes severe skin burns and eye damage.');
    expect(hazards.textContent).toContain("Recalled from memory — verify against the supplier's SDS");
    expect(hazards.textContent).toMatch(/hydrogen cyanide/);
    // A researcher reads but does not edit.
    expect(screen.queryByRole('button', { name: 'Edit recipe' })).toBeNull();
  });

  it('scales every ingredient to the volume typed in "Scale to"', async () => {
    mockFetch({ [`GET /api/recipes/${recipe.id}`]: () => json({ data: recipe }) });
    renderRecipe(`/catalogue/recipes/${recipe.id}`);
    const scaleTo = await screen.findByLabelText('Scale to (ml)');
    expect((scaleTo as HTMLInputElement).value).toBe('500');
    type(scaleTo, '2000');
    expect(screen.getByText('×4')).toBeTruthy();
    const scaled = screen.getByRole('table', { name: 'Ingredients for 2,000 ml' });
    expect(cellsOf(scaled, 'Ferric ammonium citrate').slice(0, 2)).toEqual(['16 g', '4 g']);
    expect(cellsOf(scaled, 'Potassium ferricyanide').slice(0, 2)).toEqual(['16 g', '4 g']);
    expect(cellsOf(scaled, 'Acetic acid')).toEqual(['520 g', '130 g', '28 %']);

    type(scaleTo, '0');
    expect(screen.getByLabelText('Scale to (ml)').getAttribute('aria-invalid')).toBe('true');
    expect(screen.queryByText('×4')).toBeNull();
  });

  it('reorders ingredients and sends only what changed, with the version', async () => {
    const { requests } = mockFetch({
      [`GET /api/recipes/${recipe.id}`]: () => json({ data: recipe }),
      [`PATCH /api/recipes/${recipe.id}`]: (request) => {
        const body = request.body as { ingredients: typeof recipe.ingredients };
        return json({ data: { ...recipe, ingredients: body.ingredients, version: 3 } });
      },
    });
    renderRecipe(`/catalogue/recipes/${recipe.id}`);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit recipe' }));
    fireEvent.click(screen.getByRole('button', { name: 'Move ingredient 3 up' }));
    expect(ingredient(2).getByLabelText<HTMLInputElement>('Chemical').value).toBe('Acetic acid');
    fireEvent.click(screen.getByRole('button', { name: 'Remove ingredient 1' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    expect(await screen.findByText('Recipe saved.')).toBeTruthy();
    const patch = requests.find((r) => r.method === 'PATCH');
    expect(patch?.body).toEqual({
      version: 2,
      ingredients: [
        { chemical: 'Acetic acid', amount: 130, unit: 'g', strengthPercent: 28, densityGPerMl: null },
        { chemical: 'Potassium ferricyanide', amount: 4, unit: 'g', strengthPercent: null, densityGPerMl: null },
      ],
    });
  });

  it('shows the server’s field errors on the right ingredient row and keeps the typed values', async () => {
    mockFetch({
      [`GET /api/recipes/${recipe.id}`]: () => json({ data: recipe }),
      [`PATCH /api/recipes/${recipe.id}`]: () =>
        errorResponse(400, 'validation_failed', 'Check the recipe', {
          details: [{ path: 'ingredients.1.amount', message: 'Check this amount against the volume', code: 'custom' }],
        }),
    });
    renderRecipe(`/catalogue/recipes/${recipe.id}`);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit recipe' }));
    type(ingredient(2).getByLabelText('Amount'), '4000');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    expect(await ingredient(2).findByText('Check this amount against the volume')).toBeTruthy();
    expect(ingredient(2).getByLabelText('Amount').getAttribute('aria-invalid')).toBe('true');
    expect(ingredient(2).getByLabelText<HTMLInputElement>('Amount').value).toBe('4000');
    expect(ingredient(1).getByLabelText('Amount').getAttribute('aria-invalid')).toBeNull();
  });
});
