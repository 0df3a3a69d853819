import { SignInScreen } from '@/shared/ui/screens/auth/sign-in-screen';

export default function SignIn() {
  return <SignInScreen />;
}
