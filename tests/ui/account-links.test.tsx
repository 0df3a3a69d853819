import { screen } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { press, typeInto } from './support/form';
import { installEvidenceApi, meAs, ok, page } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const TOKEN = 'tok-0123456789abcdef';
const signedOut = { 'GET /api/v1/auth/session': ok({ me: null }) };
const preview = (accountExists: boolean) => ok({ labName: 'Harbor Ridge Test Lab', email: 'priya.venkat@example.test', role: 'analyst', accountExists, expiresAt: Date.UTC(2026, 11, 4) });

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

describe('accepting an invitation', () => {
  test('the preview shows lab, role and address; the password rule is the server’s', async () => {
    const api = installEvidenceApi({ ...signedOut, [`GET /api/v1/invitations/${TOKEN}`]: preview(false) });
    await renderApp(`/accept-invitation?token=${TOKEN}`);
    const facts = (await screen.findByTestId('invitation-preview')).textContent;
    expect(facts).toContain('Harbor Ridge Test Lab');
    expect(facts).toContain('Analyst');
    expect(facts).toContain('priya.venkat@example.test');

    await typeInto('Your name', 'Priya Venkat');
    await typeInto('New password', 'short');
    await press('button', 'Join the lab');
    // passwordProblem in shared/api/people.ts: at least 12 characters.
    expect(await screen.findByText('Use at least 12 characters.')).toBeTruthy();

    await typeInto('New password', 'password1234');
    await press('button', 'Join the lab');
    expect(await screen.findByText('This password is too common; choose another.')).toBeTruthy();

    await typeInto('New password', 'priya.venkat@example.test');
    await press('button', 'Join the lab');
    expect(await screen.findByText('Do not use your e-mail address as the password.')).toBeTruthy();

    await typeInto('New password', 'plumb bob over the arm');
    await typeInto('New password again', 'plumb bob over the frame');
    await press('button', 'Join the lab');
    expect(await screen.findByText('The two passwords differ')).toBeTruthy();
    expect(api.called('POST', `/api/v1/invitations/${TOKEN}/accept`)).toHaveLength(0);
  });

  test('a new account sends its name and password, is signed in and lands on the bench', async () => {
    const me = { ...meAs('analyst'), user: { id: 'user-new', email: 'priya.venkat@example.test', displayName: 'Priya Venkat' } };
    const api = installEvidenceApi({
      ...signedOut,
      [`GET /api/v1/invitations/${TOKEN}`]: preview(false),
      [`POST /api/v1/invitations/${TOKEN}/accept`]: ok(me),
      'GET /api/v1/labs/lab-harbor-ridge/studies': ok(page([])),
    });
    await renderApp(`/accept-invitation?token=${TOKEN}`);
    await typeInto('Your name', ' Priya Venkat ');
    await typeInto('New password', 'plumb bob over the arm');
    await typeInto('New password again', 'plumb bob over the arm');
    await press('button', 'Join the lab');
    expect((await screen.findByTestId('header-user')).textContent).toContain('Priya Venkat');
    expect(api.called('POST', `/api/v1/invitations/${TOKEN}/accept`)[0].body).toEqual({ displayName: 'Priya Venkat', password: 'plumb bob over the arm' });
    expect(window.location.pathname).toBe('/');
  });

  test('with no name given, only the password is sent (an existing account)', async () => {
    const api = installEvidenceApi({ ...signedOut, [`GET /api/v1/invitations/${TOKEN}`]: preview(true), [`POST /api/v1/invitations/${TOKEN}/accept`]: { status: 401, body: { error: { code: 'invalid_credentials', message: 'The password is not right.' } } } });
    await renderApp(`/accept-invitation?token=${TOKEN}`);
    await screen.findByTestId('invitation-preview');
    // The page looks the same whether or not the address has an account; no name means "existing".
    await typeInto('Your password', 'my current password');
    await press('button', 'Join the lab');
    expect((await screen.findByTestId('accept-error')).textContent).toBe('The password is not right.');
    expect(api.called('POST', `/api/v1/invitations/${TOKEN}/accept`)[0].body).toEqual({ password: 'my current password' });
  });

  test('a used or expired link says it cannot be used', async () => {
    installEvidenceApi({ ...signedOut, [`GET /api/v1/invitations/${TOKEN}`]: { status: 410, body: { error: { code: 'invitation_expired', message: 'This invitation has expired. Ask your lab admin for a new one.' } } } });
    await renderApp(`/accept-invitation?token=${TOKEN}`);
    expect((await screen.findByTestId('error-state')).textContent).toContain('This invitation has expired');
  });
});

describe('password reset', () => {
  test('asking for a link checks the address with the shared schema, then shows the server’s answer', async () => {
    const api = installEvidenceApi({ ...signedOut, 'POST /api/v1/auth/password-reset': { status: 202, body: { message: 'If the address has an account, a reset link is on its way.' } } });
    await renderApp('/reset-password');
    await typeInto('E-mail', 'dana@');
    await press('button', 'Send the reset link');
    expect(await screen.findByText('Enter an e-mail address such as name@example.test')).toBeTruthy();
    expect(api.called('POST', '/api/v1/auth/password-reset')).toHaveLength(0);
    await typeInto('E-mail', 'Dana@Example.test');
    await press('button', 'Send the reset link');
    expect((await screen.findByTestId('reset-requested')).textContent).toBe('If the address has an account, a reset link is on its way.');
    expect(api.called('POST', '/api/v1/auth/password-reset')[0].body).toEqual({ email: 'dana@example.test' });
  });

  test('the link sets a new password under the server’s rule and says sessions ended', async () => {
    const api = installEvidenceApi({ ...signedOut, 'POST /api/v1/auth/password-reset/confirm': { status: 204 } });
    await renderApp(`/reset-password?token=${TOKEN}`);
    await typeInto('New password', 'qwertyuiop12');
    await press('button', 'Set the new password');
    expect(await screen.findByText('This password is too common; choose another.')).toBeTruthy();
    await typeInto('New password', 'a long line down the frame');
    await typeInto('New password again', 'a long line down the frame');
    await press('button', 'Set the new password');
    expect((await screen.findByTestId('reset-done')).textContent).toContain('Every earlier session of your account has ended');
    expect(api.called('POST', '/api/v1/auth/password-reset/confirm')[0].body).toEqual({ token: TOKEN, password: 'a long line down the frame' });
  });
});
