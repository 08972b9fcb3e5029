import { can } from '@toneledger/common/domain/roles';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useCatalogueSettings } from '@/lib/settings-api';
import { CatalogueSettingsForm } from '@/features/reference/components/catalogue-settings-form';

export function CatalogueSettingsPage() {
  useDocumentTitle('Catalogue settings');
  const me = useMe();
  const settings = useCatalogueSettings();
  return (
    <section>
      <PageHeader
        title="Catalogue settings"
        description="The institution's name, and the pattern that accession numbers are checked against when a print is catalogued."
      />
      {settings.isError ? <ErrorNotice error={settings.error} title="The settings could not be loaded." /> : null}
      {settings.isPending ? <Loading label="Loading settings…" /> : null}
      {settings.data ? <CatalogueSettingsForm settings={settings.data} canManage={can(me.role, 'settings.manage')} /> : null}
    </section>
  );
}
