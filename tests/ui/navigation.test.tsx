import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { demoMe, installFakeApi, signedInAs, signedOut } from './support/fake-api';
import { press } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const signedIn = signedInAs(demoMe);

describe('navigation at phone width (390 px)', () => {
  beforeEach(() => setWindowWidth(390));

  test('a bottom tab bar shows five areas and More, with the current area selected', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedIn });
    await renderApp('/');

    const tabBar = await screen.findByRole('tablist', { name: 'Areas' });
    const names = within(tabBar)
      .getAllByRole('tab')
      .map((tab) => tab.getAttribute('aria-label'));
    expect(names).toEqual(['Bench', 'Systems', 'Scenarios', 'Recipes', 'Studies', 'More']);
    expect(within(tabBar).getByRole('tab', { selected: true }).getAttribute('aria-label')).toBe('Bench');
    expect(within(tabBar).getByRole('tab', { name: 'Systems' }).getAttribute('href')).toBe('/systems');
    expect(screen.queryByRole('navigation')).toBeNull();
  });

  test('More lists the other areas, and is the selected tab while one of them is open', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedIn });
    await renderApp('/more');
    const more = ['Standards', 'Reviews', 'Lab', 'About'];
    for (const name of more) expect(await screen.findByRole('link', { name })).toBeTruthy();

    await press('link', 'Standards');

    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Standards'));
    expect(screen.getByRole('tab', { selected: true }).getAttribute('aria-label')).toBe('More');
  });

  test('a tab opens its area, whose screen says what the area is for', async () => {
    installFakeApi({
      'GET /api/v1/auth/session': signedIn,
      // The Scenarios screen lists the lab's scenarios: an empty lab shows the area's empty state.
      'GET /api/v1/labs/lab-harbor-ridge/scenarios?limit=20&offset=0&sort=updatedAt&order=desc': { status: 200, body: { items: [], total: 0, limit: 20, offset: 0 } },
    });
    await renderApp('/');

    await press('tab', 'Scenarios');

    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Scenarios'));
    expect(window.location.pathname).toBe('/scenarios');
    expect(screen.getByText(/puts a system under test conditions/)).toBeTruthy();
    // The list arrives after the screen.
    expect((await screen.findByTestId('empty-state')).textContent).toContain('No scenarios yet');
  });
});

describe('navigation at wide width (1280 px)', () => {
  beforeEach(() => setWindowWidth(1280));

  test('a side rail lists every area, marks the current one, and there is no tab bar', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedIn });
    await renderApp('/studies');

    const rail = await screen.findByRole('navigation', { name: 'Areas' });
    const links = within(rail).getAllByRole('link');
    expect(links.map((link) => link.getAttribute('aria-label'))).toEqual([
      'Bench',
      'Systems',
      'Scenarios',
      'Recipes',
      'Studies',
      'Standards',
      'Reviews',
      'Lab',
      'About',
    ]);
    const current = links.filter((link) => link.getAttribute('aria-current') === 'page');
    expect(current.map((link) => link.getAttribute('aria-label'))).toEqual(['Studies']);
    expect(screen.queryByRole('tablist')).toBeNull();
  });
});

describe('signed-in header', () => {
  beforeEach(() => setWindowWidth(390));

  test('shows the lab and the user, and signing out returns to sign-in', async () => {
    const api = installFakeApi({
      'GET /api/v1/auth/session': signedIn,
      'POST /api/v1/auth/sign-out': { status: 204 },
    });
    await renderApp('/recipes');
    expect((await screen.findByTestId('header-lab')).textContent).toBe('Harbor Ridge Test Lab');
    expect(screen.getByTestId('header-user').textContent).toContain('Mira Okafor');

    await press('button', 'Sign out');

    expect(await screen.findByLabelText('E-mail')).toBeTruthy();
    expect(api.calls.some((call) => call.method === 'POST' && call.path === '/api/v1/auth/sign-out')).toBe(true);
    await waitFor(() => expect(window.location.pathname).toBe('/sign-in'));
    expect(screen.queryByRole('tablist')).toBeNull();
  });
});

describe('About', () => {
  beforeEach(() => setWindowWidth(390));

  test('a signed-out visitor can read the three cautions and the version', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedOut });
    await renderApp('/about');

    const cautions = await screen.findByTestId('cautions');
    expect(window.location.pathname).toBe('/about');
    expect(cautions.textContent).toContain('verifies the processing, not the transducers');
    expect(cautions.textContent).toContain('does not replace calibration');
    expect(cautions.textContent).toContain('moving masses and high forces');
    expect(cautions.textContent).toContain("Responsibility stays with the lab's licensed or authorised staff");
    expect(screen.getByTestId('app-version').textContent).toMatch(/^Plumbline \S+$/);
  });
});
