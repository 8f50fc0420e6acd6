import { AdminFrame } from '../../../features/admin/components/admin-tabs';
import { AuditLog } from '../../../features/admin/components/audit-log';

export default function AdminAuditPage() {
  return (
    <AdminFrame subtitle="Sign-ins, keys and account changes">
      <AuditLog />
    </AdminFrame>
  );
}
