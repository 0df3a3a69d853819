/**
 * Systems: list view states, the editor's field errors from the server's schemas, the live facts
 * computed by the engine in the browser, and saving through the API. Expected mode facts are the
 * textbook SDOF results f_d = f_n·sqrt(1 − ζ²) and half-power bandwidth 2ζf_n (S. S. Rao,
 * Mechanical Vibrations).
 */
import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { demoMe, installFakeApi, signedInAs } from './support/fake-api';
import { press, typeInto } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const lab = '/api/v1/labs/lab-harbor-ridge';
const listPath = `${lab}/systems?limit=20&offset=0&sort=updatedAt&order=desc`;
const person = { id: 'user-analyst', displayName: 'Mira Okafor' };
const summary = {
  id: 'sys-arm',
  labId: 'lab-harbor-ridge',
  name: 'Drone motor arm',
  description: 'First bending mode near 340 Hz',
  latestVersion: 2,
  createdBy: person,
  updatedBy: person,
  createdAt: 1_764_000_000_000,
  updatedAt: 1_764_600_000_000,
};
const armSpec = { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 340, dampingRatio: 0.008, stiffnessNPerM: 250000 };
const record = (version: number, definition: unknown) => ({
  ...summary,
  latestVersion: version,
  version: { version, name: summary.name, note: version === 1 ? 'first' : 'damping from the tap test', author: person, createdAt: summary.updatedAt },
  definition,
});

beforeEach(() => setWindowWidth(390));

/** Chooses a model (a chip of the radio group) and waits until it shows as chosen. */
async function pickModel(name: string) {
  await press('radio', name);
  await waitFor(() => expect(screen.getByRole('radio', { name }).getAttribute('aria-checked')).toBe('true'));
}

describe('systems list', () => {
  test('lists the lab systems with their version', async () => {
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${listPath}`]: { status: 200, body: { items: [summary], total: 1, limit: 20, offset: 0 } },
    });
    await renderApp('/systems');
    const list = await screen.findByRole('list', { name: 'Systems' });
    expect(within(list).getByText('Drone motor arm')).toBeTruthy();
    expect(within(list).getByText(/^v2 · /)).toBeTruthy();
    expect(screen.getByText('1 system')).toBeTruthy();
  });

  test('an empty lab shows what will appear and how', async () => {
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${listPath}`]: { status: 200, body: { items: [], total: 0, limit: 20, offset: 0 } },
    });
    await renderApp('/systems');
    await waitFor(() => expect(screen.getByTestId('empty-state').textContent).toContain('No systems defined'));
    expect(screen.getByRole('button', { name: 'New system' })).toBeTruthy();
  });

  test('a failed list says why and offers to try again', async () => {
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${listPath}`]: { status: 403, body: { error: { code: 'forbidden', message: 'Your role in this lab does not allow this.' } } },
    });
    await renderApp('/systems');
    expect((await screen.findByTestId('error-state')).textContent).toContain('Your role in this lab does not allow this.');
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});

describe('system editor', () => {
  test('an empty name and a damping ratio of 1 show the schema errors and send nothing', async () => {
    const api = installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await renderApp('/systems/new');
    await typeInto('Damping ratio ζ', '1');
    await typeInto('Stiffness k (N/m)', '');
    await press('button', 'Save system');
    expect(await screen.findByText('Give a name')).toBeTruthy();
    expect(screen.getByLabelText('Damping ratio ζ').getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText('Must be < 1')).toBeTruthy(); // z.number().lt(1) of the engine's schema
    expect(screen.getByText('Enter a number')).toBeTruthy();
    expect(api.calls.filter((c) => c.method === 'POST')).toHaveLength(0);
  });

  test('the mode facts follow the typed values, computed in the browser', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await renderApp('/systems/new');
    await typeInto('Natural frequency fₙ (Hz)', '100');
    await typeInto('Damping ratio ζ', '0.02');
    // f_d = 100·sqrt(1 − 0.02²) = 99.980 Hz; 2ζf_n = 4 Hz.
    await waitFor(() => expect(within(screen.getByTestId('mode-1')).getByText('99.980 Hz')).toBeTruthy());
    const mode = within(screen.getByTestId('mode-1'));
    expect(mode.getByText(/^4(\.00)? Hz$/)).toBeTruthy();
    expect(mode.getByText(/^2(\.00)? %$/)).toBeTruthy();
    // Decay to 1 %: ln(100)/(ζω_n) = 4.605/(0.02·2π·100) = 0.366 s.
    expect(mode.getByText('0.366 s')).toBeTruthy();
    expect(screen.getByTestId('system-frf-magnitude')).toBeTruthy();

    await typeInto('Natural frequency fₙ (Hz)', '-5');
    expect((await screen.findByTestId('preview-problem')).textContent).toContain('naturalFrequencyHz');
  });

  test('switching to mass, stiffness, damping converts the values exactly', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await renderApp('/systems/new');
    await typeInto('Natural frequency fₙ (Hz)', '100');
    await typeInto('Damping ratio ζ', '0.01');
    await typeInto('Stiffness k (N/m)', String(4e4 * Math.PI ** 2));
    await pickModel('Mass, stiffness, damping');
    // m = k/(2π f_n)² = 4e4·π²/(4π²·1e4) = 1 kg; c = 2ζ·sqrt(k·m) = 0.02·200π = 12.566 N·s/m.
    expect(Number(((await screen.findByLabelText('Mass m (kg)')) as HTMLInputElement).value)).toBeCloseTo(1, 12);
    expect(Number((screen.getByLabelText('Damping c (N·s/m)') as HTMLInputElement).value)).toBeCloseTo(4 * Math.PI, 10);
  });

  test('switching the model keeps what was typed for the other model', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await renderApp('/systems/new');
    await typeInto('Natural frequency fₙ (Hz)', '123');
    await pickModel('Modes (modal)');
    expect(await screen.findByRole('group', { name: 'Mode 3' })).toBeTruthy();
    await pickModel('Masses, springs, dampers');
    expect(await screen.findByLabelText('Mass 2 (kg)')).toBeTruthy();
    await pickModel('Single mass (SDOF)');
    expect(((await screen.findByLabelText('Natural frequency fₙ (Hz)')) as HTMLInputElement).value).toBe('123');
  });

  test('a two-mass chain with equal masses and springs has its modes at 0.618 and 1.618·sqrt(k/m)', async () => {
    // Ground–m–m chain, equal springs k: ω = sqrt(k/m)·sqrt((3 ∓ √5)/2) (standard textbook result).
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe) });
    await renderApp('/systems/new');
    await pickModel('Masses, springs, dampers');
    await typeInto('Mass 1 (kg)', '1');
    await typeInto('Mass 2 (kg)', '1');
    await typeInto('Stiffness of spring 1 (N/m)', '10000');
    await typeInto('Stiffness of spring 2 (N/m)', '10000');
    await typeInto('Damping of damper 1 (N·s/m)', '0.01');
    await typeInto('Damping of damper 2 (N·s/m)', '0.01');
    const f = (r: number) => (100 * Math.sqrt((3 + r * Math.sqrt(5)) / 2)) / (2 * Math.PI);
    const natural = (mode: number) => within(screen.getByTestId(`mode-${mode}`)).getByText('Natural frequency fₙ').parentElement!.textContent;
    await waitFor(() => expect(natural(1)).toBe(`Natural frequency fₙ${f(-1).toPrecision(5)} Hz`)); // 9.8363 Hz
    await waitFor(() => expect(natural(2)).toBe(`Natural frequency fₙ${f(1).toPrecision(5)} Hz`)); // 25.752 Hz
  });

  test('saving a new system posts the definition and opens it', async () => {
    const saved = { ...record(1, armSpec), id: 'sys-new' };
    const api = installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`POST ${lab}/systems`]: { status: 201, body: saved },
      [`GET ${lab}/systems/sys-new`]: { status: 200, body: saved },
      [`GET ${lab}/systems/sys-new/versions`]: { status: 200, body: { items: [saved.version] } },
    });
    await renderApp('/systems/new');
    await typeInto('Name', 'Drone motor arm');
    await typeInto('What this version changes', 'first');
    await press('button', 'Save system');
    await waitFor(() => expect(window.location.pathname).toBe('/systems/sys-new'));
    const post = api.calls.find((c) => c.method === 'POST');
    expect(post?.body).toEqual({ name: 'Drone motor arm', description: '', note: 'first', definition: armSpec });
  });

  test('a version saved by someone else meanwhile (409) is reported, and the history compares versions', async () => {
    const v1 = record(1, armSpec);
    const v2 = record(2, { ...armSpec, dampingRatio: 0.012 });
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${listPath}`]: { status: 200, body: { items: [summary], total: 1, limit: 20, offset: 0 } },
      [`GET ${lab}/systems/sys-arm`]: { status: 200, body: v2 },
      [`GET ${lab}/systems/sys-arm/versions`]: { status: 200, body: { items: [v2.version, v1.version] } },
      [`GET ${lab}/systems/sys-arm/versions/1`]: { status: 200, body: v1 },
      [`GET ${lab}/systems/sys-arm/versions/2`]: { status: 200, body: v2 },
      [`PUT ${lab}/systems/sys-arm`]: { status: 409, body: { error: { code: 'version_conflict', message: 'Version 3 was saved meanwhile' } } },
    });
    await renderApp('/systems/sys-arm');
    await waitFor(() => expect(screen.getByTestId('change-table').textContent).toContain('dampingRatio'));
    const table = screen.getByTestId('change-table');
    expect(table.textContent).toContain('0.008');
    expect(table.textContent).toContain('0.012');
    await press('button', 'Save version');
    expect((await screen.findByTestId('save-error')).textContent).toContain('Version 3 was saved meanwhile');
  });
});
