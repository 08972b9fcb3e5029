import type { Area } from '@toneledger/common/domain/areas';
import { PageHeader } from '@/components/ui/page-header';
import { Notice } from '@/components/ui/notice';
import { useDocumentTitle } from '@/lib/use-document-title';

/** An area whose screens do not exist yet: says so, and what it will hold. No sample data. */
export function AreaPendingPage({ area }: { area: Area }) {
  useDocumentTitle(area.label);
  return (
    <section>
      <PageHeader title={area.label} />
      <div className="max-w-2xl">
        <Notice tone="warning" title="This area is not built yet.">
          <p className="mt-1">When it is ready it will hold: {area.summary}</p>
        </Notice>
      </div>
    </section>
  );
}
