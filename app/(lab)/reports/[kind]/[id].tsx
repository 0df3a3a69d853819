import { useLocalSearchParams } from 'expo-router';
import { ReportScreen } from '@/shared/ui/screens/reports/report-screen';

export default function ReportRoute() {
  const { kind, id } = useLocalSearchParams<{ kind: string; id: string }>();
  return <ReportScreen kind={kind === 'standard' ? 'standard' : 'study'} targetId={String(id)} />;
}
