/** Lab admin: members and roles, invitations, sent mail. Other roles see a plain refusal. */
import { useSession } from '@/shared/ui/api/use-session';
import { EmptyState } from '@/shared/ui/components';
import { roleWords, useCurrentLab } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { PageHead, TextLink } from '../kit/panel';
import { Column } from '../kit/two-pane';
import { InvitationsPanel } from './invitations-panel';
import { LabSettingsPanel } from './lab-settings-panel';
import { MailPanel } from './mail-panel';
import { MembersPanel } from './members-panel';

export function AdminScreen() {
  const lab = useCurrentLab();
  const session = useSession();
  const area = areaById('lab');
  const myUserId = session.status === 'signed-in' ? session.me.user.id : '';
  if (!lab || lab.role !== 'admin') {
    return (
      <Column title="Lab">
        <PageHead title="Lab" eyebrow={area.group} intro={lab ? `${lab.labName} · you are ${roleWords[lab.role].toLowerCase()}` : undefined} />
        <EmptyState title="Not for your role" body="Members, roles, invitations and the lab's mail are managed by lab admins. Ask one if something here needs to change." testID="role-refused" />
      </Column>
    );
  }
  return (
    <Column title="Lab">
      <PageHead title="Lab" eyebrow={area.group} intro={`${lab.labName}: ${area.purpose}`} actions={<TextLink href="/audit">Audit trail</TextLink>} />
      <LabSettingsPanel labId={lab.labId} />
      <MembersPanel labId={lab.labId} myUserId={myUserId} />
      <InvitationsPanel labId={lab.labId} />
      <MailPanel labId={lab.labId} />
    </Column>
  );
}
