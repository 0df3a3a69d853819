import { fireEvent, screen, waitFor, within } from '@testing-library/dom';
import { act } from 'react';
import { renderApp, setWindowWidth } from './support/app';
import { press, typeInto } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, session } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const member = (userId: string, displayName: string, email: string, role: string) => ({ userId, displayName, email, role, joinedAt: Date.UTC(2026, 0, 5) });
const members = page([member('user-admin', 'Mara Okafor', 'admin@harborridge.test', 'admin'), member('user-analyst', 'Tomas Lindqvist', 'analyst@harborridge.test', 'analyst')]);
const invitation = { id: 'inv-1', email: 'new.analyst@example.test', role: 'analyst', status: 'pending', invitedBy: { userId: 'user-admin', displayName: 'Mara Okafor' }, createdAt: 1, expiresAt: 2, usedAt: null };
const adminRoutes = {
  ...session(meAs('admin')),
  [`GET ${lab('/members')}`]: ok(members),
  [`GET ${lab('/invitations')}`]: ok(page([invitation])),
  [`GET ${lab('/mail')}`]: ok(page([{ id: 1, to: 'new.analyst@example.test', subject: 'You are invited to Harbor Ridge Test Lab', text: 'Open the link', kind: 'invitation', status: 'sent', error: null, createdAt: 1, sentAt: 2 }])),
};

describe('lab admin', () => {
  test('other roles see a plain "not for your role" state and no member list', async () => {
    const api = installEvidenceApi({ ...session(meAs('reviewer')) });
    await renderApp('/lab');
    expect((await screen.findByTestId('role-refused')).textContent).toContain('Not for your role');
    expect(api.called('GET', lab('/members'))).toHaveLength(0);
  });

  test('changing a role asks first, and only the confirmation PATCHes it', async () => {
    const api = installEvidenceApi({ ...adminRoutes, [`PATCH ${lab('/members/user-analyst')}`]: ok(member('user-analyst', 'Tomas Lindqvist', 'analyst@harborridge.test', 'reviewer')) });
    await renderApp('/lab');
    await act(async () => {
      fireEvent.change(await screen.findByLabelText('Role of Tomas Lindqvist'), { target: { value: 'reviewer' } });
    });
    const dialog = await screen.findByRole('dialog', { name: "Change this member's role?" });
    expect(dialog.textContent).toContain('Tomas Lindqvist goes from Analyst to Reviewer');
    expect(api.called('PATCH', lab('/members/user-analyst'))).toHaveLength(0);
    await press('button', 'Change the role');
    await waitFor(() => expect(api.called('PATCH', lab('/members/user-analyst'))).toHaveLength(1));
    expect(api.called('PATCH', lab('/members/user-analyst'))[0].body).toEqual({ role: 'reviewer' });
  });

  test('an invitation to a bad address is refused by the shared schema; a good one is posted', async () => {
    const api = installEvidenceApi({ ...adminRoutes, [`POST ${lab('/invitations')}`]: { status: 201, body: { ...invitation, id: 'inv-2', email: 'priya@example.test', role: 'auditor' } } });
    await renderApp('/lab');
    await typeInto('E-mail to invite', 'priya@');
    await press('button', 'Send the invitation');
    expect(await screen.findByText('Enter an e-mail address such as name@example.test')).toBeTruthy();
    expect(api.called('POST', lab('/invitations'))).toHaveLength(0);
    await typeInto('E-mail to invite', ' Priya@Example.test ');
    await press('radio', 'Auditor');
    await waitFor(() => expect(screen.getByRole('radio', { name: 'Auditor' }).getAttribute('aria-checked')).toBe('true'));
    await press('button', 'Send the invitation');
    expect(await screen.findByText('Invitation sent to priya@example.test; the link is valid for 72 hours.')).toBeTruthy();
    expect(api.called('POST', lab('/invitations'))[0].body).toEqual({ email: 'priya@example.test', role: 'auditor' });
  });

  test('revoking asks first and then DELETEs the invitation; sent mail is listed', async () => {
    const api = installEvidenceApi({ ...adminRoutes, [`DELETE ${lab('/invitations/inv-1')}`]: { status: 204 } });
    await renderApp('/lab');
    await waitFor(() => expect(screen.getByTestId('mail-panel').textContent).toContain('You are invited to Harbor Ridge Test Lab'));
    await press('button', 'Revoke new.analyst@example.test');
    const dialog = await screen.findByRole('dialog', { name: 'Revoke this invitation?' });
    expect(api.called('DELETE', lab('/invitations/inv-1'))).toHaveLength(0);
    await act(async () => {
      fireEvent.click(within(dialog).getByRole('button', { name: 'Revoke it' }));
    });
    await waitFor(() => expect(api.called('DELETE', lab('/invitations/inv-1'))).toHaveLength(1));
  });

  test('with real SMTP the mail panel says where mail goes instead of an error', async () => {
    installEvidenceApi({ ...adminRoutes, [`GET ${lab('/mail')}`]: { status: 409, body: { error: { code: 'mail_view_off', message: 'Mail goes to a real SMTP server.' } } } });
    await renderApp('/lab');
    expect(await screen.findByText(/Mail goes to a real mail server/)).toBeTruthy();
  });
});
