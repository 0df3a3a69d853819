import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { demoMe, installFakeApi, signedInAs, signedOut } from './support/fake-api';
import { press, typeInto } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const badCredentials = {
  status: 401,
  body: { error: { code: 'invalid_credentials', message: 'E-mail or password is not right' } },
};

beforeEach(() => setWindowWidth(390));

function signInCalls(calls: { method: string; path: string }[]) {
  return calls.filter((call) => call.method === 'POST' && call.path === '/api/v1/auth/sign-in');
}

describe('sign-in screen', () => {
  test('an empty form shows the schema errors under both fields and sends nothing', async () => {
    const api = installFakeApi({ 'GET /api/v1/auth/session': signedOut });
    await renderApp('/sign-in');
    expect((await screen.findByTestId('screen-title')).textContent).toBe('Plumbline');

    await press('button', 'Sign in');

    expect(await screen.findByText('Enter an e-mail address such as name@example.test')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(signInCalls(api.calls)).toHaveLength(0);
  });

  test('an address without a domain is refused before it is sent', async () => {
    const api = installFakeApi({ 'GET /api/v1/auth/session': signedOut });
    await renderApp('/sign-in');
    await typeInto('E-mail', 'mira.okafor@');
    await typeInto('Password', 'a password');

    await press('button', 'Sign in');

    expect(await screen.findByText('Enter an e-mail address such as name@example.test')).toBeTruthy();
    expect(screen.queryByText('Enter your password')).toBeNull();
    expect(signInCalls(api.calls)).toHaveLength(0);
  });

  test("a 401 from the server shows the server's message", async () => {
    const api = installFakeApi({ 'GET /api/v1/auth/session': signedOut, 'POST /api/v1/auth/sign-in': badCredentials });
    await renderApp('/sign-in');
    await typeInto('E-mail', 'mira.okafor@example.test');
    await typeInto('Password', 'not the password');

    await press('button', 'Sign in');

    expect((await screen.findByTestId('sign-in-error')).textContent).toContain('E-mail or password is not right');
    expect(signInCalls(api.calls)).toHaveLength(1);
    expect(screen.queryByRole('tablist')).toBeNull();
  });

  test('a 401 without a body still says that the e-mail or password is not right', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedOut, 'POST /api/v1/auth/sign-in': { status: 401 } });
    await renderApp('/sign-in');
    await typeInto('E-mail', 'mira.okafor@example.test');
    await typeInto('Password', 'not the password');

    await press('button', 'Sign in');

    expect((await screen.findByTestId('sign-in-error')).textContent).toContain('E-mail or password is not right');
  });

  test('a good sign-in sends the normalised address with cookies and opens the shell', async () => {
    const api = installFakeApi({
      'GET /api/v1/auth/session': signedOut,
      'POST /api/v1/auth/sign-in': { status: 200, body: demoMe },
    });
    await renderApp('/sign-in');
    await typeInto('E-mail', '  Mira.Okafor@Example.test ');
    await typeInto('Password', 'the password');

    await press('button', 'Sign in');

    expect((await screen.findByTestId('header-lab')).textContent).toBe('Harbor Ridge Test Lab');
    const [call] = signInCalls(api.calls);
    expect(call).toMatchObject({
      body: { email: 'mira.okafor@example.test', password: 'the password' },
      credentials: 'include',
    });
    expect(screen.getByTestId('header-user').textContent).toContain('Mira Okafor');
    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Bench'));
    expect(window.location.pathname).toBe('/');
  });

  test('a signed-out visit to an area goes to sign-in and returns there afterwards', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedOut, 'POST /api/v1/auth/sign-in': { status: 200, body: demoMe } });
    await renderApp('/studies');
    await waitFor(() => expect(window.location.pathname + window.location.search).toBe('/sign-in?next=%2Fstudies'));

    await typeInto('E-mail', 'mira.okafor@example.test');
    await typeInto('Password', 'the password');
    await press('button', 'Sign in');

    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Studies'));
    expect(window.location.pathname).toBe('/studies');
  });

  test('when the server cannot be reached the sign-in screen says so', async () => {
    installFakeApi({});
    globalThis.fetch = jest.fn(async () => {
      throw new TypeError('Failed to fetch');
    }) as unknown as typeof fetch;
    await renderApp('/');
    // useMe retries once, a second later, before it reports the failure.
    expect((await screen.findByTestId('server-notice')).textContent).toContain("Plumbline's server could not be reached");
    expect(await screen.findByLabelText('E-mail')).toBeTruthy();

    // The server is back and the browser still holds a session: "Try again" opens the shell.
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await press('button', 'Try again');
    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Bench'));
  });
});
