import { ResetPasswordScreen } from '@/shared/ui/screens/account/reset-password-screen';

export default function ResetPasswordRoute() {
  return <ResetPasswordScreen />;
}
