import { AdminFrame } from '../../../features/admin/components/admin-tabs';
import { UsersPanel } from '../../../features/admin/components/users-panel';

export default function AdminUsersPage() {
  return (
    <AdminFrame subtitle="People who can sign in, and their roles">
      <UsersPanel />
    </AdminFrame>
  );
}
