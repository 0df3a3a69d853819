import { AdminScreen } from '@/shared/ui/screens/admin/admin-screen';

export default function LabRoute() {
  return <AdminScreen />;
}
