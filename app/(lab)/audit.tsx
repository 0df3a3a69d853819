import { AuditScreen } from '@/shared/ui/screens/audit/audit-screen';

export default function AuditRoute() {
  return <AuditScreen />;
}
