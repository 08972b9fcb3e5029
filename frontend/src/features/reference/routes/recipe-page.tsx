import { useState } from 'react';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useRecipe } from '@/features/reference/api/get-recipe';
import { RecipeEditor } from '@/features/reference/components/recipe-editor';
import { formatQuantity } from '@/features/reference/components/recipe-format';
import { RecipeView } from '@/features/reference/components/recipe-view';
import { SavedNotice } from '@/features/reference/components/saved-notice';

function BackLink() {
  return (
    <Link to="/catalogue/recipes" className="text-sm">
      All recipes
    </Link>
  );
}

function NewRecipe({ canWrite }: { canWrite: boolean }) {
  useDocumentTitle('New recipe');
  const navigate = useNavigate();
  return (
    <section>
      <PageHeader title="New recipe" description="Ingredients for the volume the recipe states; the amounts per litre and the cautions update as you type." actions={<BackLink />} />
      {canWrite ? (
        <RecipeEditor
          recipe={null}
          onCancel={() => navigate('/catalogue/recipes')}
          onSaved={(recipe) => navigate(`/catalogue/recipes/${recipe.id}`, { replace: true, state: { saved: 'added' } })}
        />
      ) : (
        <Notice tone="info" title="Only registrars and administrators add recipes." />
      )}
    </section>
  );
}

function ExistingRecipe({ id, canWrite }: { id: string; canWrite: boolean }) {
  const recipe = useRecipe(id);
  const [editing, setEditing] = useState(false);
  const location = useLocation();
  const [saved, setSaved] = useState<string | null>(() =>
    (location.state as { saved?: string } | null)?.saved === 'added' ? 'Recipe added.' : null,
  );
  useDocumentTitle(recipe.data?.name ?? 'Bath recipe');

  if (recipe.isPending) return <Loading label="Loading the recipe…" />;
  if (recipe.isError) {
    return (
      <section>
        <PageHeader title="Bath recipe" actions={<BackLink />} />
        <ErrorNotice error={recipe.error} title="The recipe could not be loaded." />
      </section>
    );
  }
  const data = recipe.data;
  const summary = `${data.tonerClass ? TONER_CLASS.labels[data.tonerClass] : 'Toner not stated'} · ${formatQuantity(data.volumeMl)} ml`;

  return (
    <section>
      <PageHeader
        title={editing ? `Edit recipe: ${data.name}` : data.name}
        description={summary}
        actions={
          <>
            <BackLink />
            {canWrite && !editing ? (
              <Button
                variant="primary"
                onClick={() => {
                  setSaved(null);
                  setEditing(true);
                }}
              >
                Edit recipe
              </Button>
            ) : null}
          </>
        }
      />
      <SavedNotice saved={saved} />
      {editing ? (
        <RecipeEditor
          key={data.id}
          recipe={data}
          onCancel={() => setEditing(false)}
          onSaved={() => {
            setEditing(false);
            setSaved('Recipe saved.');
          }}
        />
      ) : (
        <RecipeView recipe={data} />
      )}
    </section>
  );
}

/** `/catalogue/recipes/:id` — one recipe; `/catalogue/recipes/new` — a new one. */
export function RecipePage() {
  const { id = '' } = useParams();
  const me = useMe();
  const canWrite = can(me.role, 'catalogue.write');
  if (id === 'new') return <NewRecipe canWrite={canWrite} />;
  return <ExistingRecipe key={id} id={id} canWrite={canWrite} />;
}
