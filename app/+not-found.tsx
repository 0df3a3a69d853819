import { NotFoundScreen } from '@/shared/ui/screens/not-found/not-found-screen';

export default function NotFound() {
  return <NotFoundScreen />;
}
