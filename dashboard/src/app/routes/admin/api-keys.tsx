import { AdminFrame } from '../../../features/admin/components/admin-tabs';
import { ApiKeysPanel } from '../../../features/admin/components/api-keys-panel';

export default function AdminApiKeysPage() {
  return (
    <AdminFrame subtitle="API keys of your organisation">
      <ApiKeysPanel />
    </AdminFrame>
  );
}
