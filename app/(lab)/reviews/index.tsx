import { ReviewsScreen } from '@/shared/ui/screens/reviews/reviews-screen';

export default function ReviewsRoute() {
  return <ReviewsScreen />;
}
