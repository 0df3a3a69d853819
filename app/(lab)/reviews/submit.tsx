import { SubmitReviewScreen } from '@/shared/ui/screens/reviews/submit-screen';

export default function SubmitReviewRoute() {
  return <SubmitReviewScreen />;
}
