import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Link, useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { referenceListQuerySchema, type Recipe } from '@toneledger/common/schemas/catalogue';
import { TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { HazardMark } from '@/components/safety/ingredient-hazards';
import { useMe } from '@/lib/auth';
import { recipesQueryOptions } from '@/lib/reference-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { formatQuantity } from '@/features/reference/components/recipe-format';
import { ReferenceListLayout } from '@/features/reference/components/reference-list-layout';
import { CountCell, Empty, ReferenceTable } from '@/features/reference/components/reference-table';

const column = createColumnHelper<Recipe>();

const columns = [
  column.accessor('name', {
    header: 'Name',
    cell: (info) => (
      <Link to={`/catalogue/recipes/${info.row.original.id}`} className="font-medium">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('tonerClass', {
    header: 'Toner',
    cell: (info) => {
      const value = info.getValue();
      return value ? TONER_CLASS.labels[value] : <Empty>Not stated</Empty>;
    },
  }),
  column.accessor('volumeMl', { header: 'Volume (ml)', cell: (info) => <span className="num block text-right">{formatQuantity(info.getValue())}</span> }),
  column.accessor((recipe) => recipe.ingredients.length, {
    id: 'ingredients',
    header: 'Ingredients',
    cell: (info) => <CountCell value={info.getValue()} />,
  }),
  column.accessor('stepCount', { header: 'Steps using it', cell: (info) => <CountCell value={info.getValue()} /> }),
  column.display({ id: 'hazards', header: 'Hazards', cell: ({ row }) => <HazardMark ingredients={row.original.ingredients} /> }),
];

export function RecipesPage() {
  useDocumentTitle('Bath recipes');
  const me = useMe();
  const navigate = useNavigate();
  const canWrite = can(me.role, 'catalogue.write');
  const [query, setQuery] = useSearchQuery(referenceListQuerySchema);
  const list = useQuery({ ...recipesQueryOptions(query), placeholderData: keepPreviousData });

  return (
    <ReferenceListLayout
      title="Bath recipes"
      description="Toners and other baths as mixed: ingredients for a stated volume, normalised per litre. Open a recipe to see its safety cautions and to scale it to another volume; the safety data sheets, local regulations and your institution's health-and-safety practice take precedence over anything shown here."
      newLabel={canWrite ? 'New recipe' : undefined}
      onNew={() => navigate('/catalogue/recipes/new')}
      searchWhat="recipes"
      searchLabel="Name or chemical"
      query={query}
      setQuery={setQuery}
      list={list}
      what="recipes"
      renderTable={(rows, busy) => (
        <ReferenceTable rows={rows} columns={columns} caption="Bath recipes" empty={query.q ? 'No recipe matches this search.' : 'No recipes yet.'} busy={busy} />
      )}
    />
  );
}
