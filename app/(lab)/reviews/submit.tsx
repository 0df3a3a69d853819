import { useLocalSearchParams } from 'expo-router';
import { SubmitReviewScreen } from '@/shared/ui/screens/reviews/submit-screen';

/** /reviews/submit, or /reviews/submit?from=<returned submission> to put it forward again. */
export default function SubmitReviewRoute() {
  const { from } = useLocalSearchParams<{ from?: string }>();
  return <SubmitReviewScreen from={typeof from === 'string' ? from : undefined} />;
}
