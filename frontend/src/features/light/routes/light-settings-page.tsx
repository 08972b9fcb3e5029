import { can } from '@toneledger/common/domain/roles';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useLightSettings } from '@/features/light/api/light-settings';
import { LightSettingsForm } from '@/features/light/components/light-settings-form';
import { RecomputeProgress } from '@/features/light/components/recompute-progress';

export function LightSettingsPage() {
  useDocumentTitle('Light settings');
  const me = useMe();
  const settings = useLightSettings();
  return (
    <section>
      <PageHeader
        title="Light settings"
        description="The light budget of each responsivity category, where the figures come from, and the rules that give each print its default category from its process and toning."
      />
      <RecomputeProgress />
      {settings.isError ? <ErrorNotice error={settings.error} title="The settings could not be loaded." /> : null}
      {settings.isPending ? <Loading label="Loading settings…" /> : null}
      {settings.data ? <LightSettingsForm settings={settings.data} canManage={can(me.role, 'settings.manage')} /> : null}
    </section>
  );
}
