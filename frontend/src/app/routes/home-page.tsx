import { ROLE_DESCRIPTIONS } from '@toneledger/common/domain/roles';
import type { Area } from '@toneledger/common/domain/areas';
import { useMe } from '@/lib/auth';
import { navAreas } from '@/app/layout/nav-areas';
import { useDocumentTitle } from '@/lib/use-document-title';

function greeting(now: Date): string {
  const hour = now.getHours();
  if (hour < 12) return 'Good morning';
  if (hour < 18) return 'Good afternoon';
  return 'Good evening';
}

function AreaCard({ area }: { area: Area }) {
  return (
    <li className="flex flex-col gap-2 rounded border border-paper-300 bg-white p-4">
      <div className="flex items-baseline justify-between gap-2">
        <h3 className="text-lg">{area.label}</h3>
        <span
          className={`rounded px-1.5 py-0.5 text-[0.6875rem] font-semibold tracking-wide uppercase ${
            area.ready ? 'bg-iron-50 text-iron-800' : 'bg-sepia-50 text-sepia-800'
          }`}
        >
          {area.ready ? 'Open' : 'Not built yet'}
        </span>
      </div>
      <p className="text-sm text-ink-700">{area.summary}</p>
    </li>
  );
}

export function HomePage() {
  const me = useMe();
  useDocumentTitle('Overview');
  const { main, admin } = navAreas(me);
  return (
    <div className="max-w-5xl">
      <h1 className="text-[1.75rem]">
        {greeting(new Date())}, {me.name}
      </h1>
      <section aria-labelledby="your-role" className="mt-4 rounded border-l-4 border-sepia-700 bg-sepia-50 px-4 py-3">
        <h2 id="your-role" className="font-sans text-xs font-semibold tracking-wider text-sepia-800 uppercase">
          What your role lets you do
        </h2>
        {/* The role's name is beside the person's name in the header; it is not repeated here. */}
        <p className="mt-1 text-ink-800">{ROLE_DESCRIPTIONS[me.role]}</p>
      </section>

      <section aria-labelledby="your-areas" className="mt-8">
        <h2 id="your-areas" className="text-xl">
          What you can open
        </h2>
        <p className="mt-1 text-sm text-ink-700">Each area is in the menu. Areas your role does not open are not shown.</p>
        <ul className="mt-4 grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
          {main.map((area) => (
            <AreaCard key={area.id} area={area} />
          ))}
        </ul>
      </section>

      {admin.length > 0 ? (
        <section aria-labelledby="your-admin-areas" className="mt-8">
          <h2 id="your-admin-areas" className="text-xl">
            Administration
          </h2>
          <ul className="mt-4 grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
            {admin.map((area) => (
              <AreaCard key={area.id} area={area} />
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
