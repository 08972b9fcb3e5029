import { can } from '@toneledger/common/domain/roles';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useClimateSettings } from '@/features/climate/api/climate';
import { ClimateSettingsForm } from '@/features/climate/components/climate-settings-form';

export function ClimateSettingsPage() {
  useDocumentTitle('Climate settings');
  const me = useMe();
  const settings = useClimateSettings();
  return (
    <section>
      <PageHeader
        title="Climate settings"
        description="The target temperature and RH ranges with their source, the reference climate and constants of the relative-permanence model, and when an excursion is brief or the record has a gap."
      />
      {settings.isError ? <ErrorNotice error={settings.error} title="The settings could not be loaded." /> : null}
      {settings.isPending ? <Loading label="Loading settings…" /> : null}
      {settings.data ? <ClimateSettingsForm settings={settings.data} canManage={can(me.role, 'settings.manage')} /> : null}
    </section>
  );
}
