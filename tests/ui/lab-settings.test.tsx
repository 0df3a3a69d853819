import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { press, typeInto } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, session } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const settings = (over: Record<string, unknown> = {}) => ({
  id: 'lab-harbor-ridge', name: 'Harbor Ridge Test Lab', slug: 'harbor-ridge', reportFooter: 'Harbor Ridge Test Lab · method validation', createdAt: 1, updatedAt: null, role: 'admin', ...over,
});
const adminRoutes = {
  ...session(meAs('admin')),
  [`GET ${lab('')}`]: ok(settings()),
  [`GET ${lab('/members')}`]: ok(page([])),
  [`GET ${lab('/invitations')}`]: ok(page([])),
  [`GET ${lab('/mail')}`]: ok(page([])),
};

/** Waits until the form shows the lab's stored settings (typing before that would be replaced). */
async function settingsLoaded() {
  await waitFor(() => expect((screen.getByLabelText('Lab name') as HTMLInputElement).value).toBe('Harbor Ridge Test Lab'));
}

describe('lab settings', () => {
  test('an admin sees the current name and footer, and saving sends only what changed', async () => {
    const api = installEvidenceApi({ ...adminRoutes, [`PATCH ${lab('')}`]: ({ body }) => ok(settings({ ...(body as object), updatedAt: Date.UTC(2026, 11, 1, 12) })) });
    await renderApp('/lab');
    await settingsLoaded();
    expect((screen.getByLabelText('Report footer') as HTMLTextAreaElement).value).toBe('Harbor Ridge Test Lab · method validation');

    await typeInto('Report footer', 'Harbor Ridge · accredited vibration testing');
    await press('button', 'Save the settings');

    expect((await screen.findByTestId('lab-settings-saved')).textContent).toBe('Settings saved.');
    const [call] = api.called('PATCH', lab(''));
    expect(call.body).toEqual({ reportFooter: 'Harbor Ridge · accredited vibration testing' });
    await waitFor(() => expect(screen.getByTestId('lab-settings').textContent).toContain('Last changed 2026-12-01 12:00 UTC'));
  });

  test('a one-letter name is refused under the field by the shared schema; nothing is sent', async () => {
    const api = installEvidenceApi(adminRoutes);
    await renderApp('/lab');
    await settingsLoaded();
    await typeInto('Lab name', 'H');
    await press('button', 'Save the settings');
    await waitFor(() => expect(screen.getByLabelText('Lab name').getAttribute('aria-invalid')).toBe('true'));
    expect(api.called('PATCH', lab(''))).toHaveLength(0);
  });

  test('saving with nothing changed says so and sends nothing', async () => {
    const api = installEvidenceApi(adminRoutes);
    await renderApp('/lab');
    await settingsLoaded();
    await press('button', 'Save the settings');
    expect((await screen.findByTestId('lab-settings-problem')).textContent).toBe('Change at least one setting');
    expect(api.called('PATCH', lab(''))).toHaveLength(0);
  });

  test("a field the server refuses shows the server's message under that field", async () => {
    installEvidenceApi({
      ...adminRoutes,
      [`PATCH ${lab('')}`]: { status: 400, body: { error: { code: 'invalid_request', message: 'reportFooter: Too long', details: { fields: [{ path: 'reportFooter', message: 'Keep the footer under 2000 characters' }] } } } },
    });
    await renderApp('/lab');
    await settingsLoaded();
    await typeInto('Report footer', 'A new footer');
    await press('button', 'Save the settings');
    expect(await screen.findByText('Keep the footer under 2000 characters')).toBeTruthy();
    expect(screen.getByLabelText('Report footer').getAttribute('aria-invalid')).toBe('true');
  });

  test('other roles do not see the settings', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('')}`]: ok(settings({ role: 'analyst' })) });
    await renderApp('/lab');
    expect(await screen.findByTestId('role-refused')).toBeTruthy();
    expect(screen.queryByLabelText('Lab name')).toBeNull();
    expect(api.called('GET', lab(''))).toHaveLength(0);
  });
});
