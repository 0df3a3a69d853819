import { AcceptInvitationScreen } from '@/shared/ui/screens/account/accept-invitation-screen';

export default function AcceptInvitationRoute() {
  return <AcceptInvitationScreen />;
}
