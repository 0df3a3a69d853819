import { useLocalSearchParams } from 'expo-router';
import { ReviewsScreen } from '@/shared/ui/screens/reviews/reviews-screen';

export default function ReviewRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <ReviewsScreen submissionId={String(id)} />;
}
