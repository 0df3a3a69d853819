/**
 * Scenarios: list states, the editor's field errors (zod schema, then the engine's cross-field
 * rules as the server applies them), error sources switched on and saved, the signals simulated in
 * the browser, the system copied from the lab's list, and the CSV export links.
 */
import { fireEvent, screen, waitFor, within } from '@testing-library/dom';
import { act } from 'react';
import { renderApp, setWindowWidth } from './support/app';
import { demoMe, installFakeApi, signedInAs } from './support/fake-api';
import { press, typeInto } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const lab = '/api/v1/labs/lab-harbor-ridge';
const page = (kind: string, limit = 20) => `${lab}/${kind}?limit=${limit}&offset=0&sort=updatedAt&order=desc`;
const none = { status: 200, body: { items: [], total: 0, limit: 20, offset: 0 } };
const person = { id: 'user-analyst', displayName: 'Mira Okafor' };
const head = (id: string, name: string, latestVersion = 1) => ({
  id,
  labId: 'lab-harbor-ridge',
  name,
  description: '',
  latestVersion,
  createdBy: person,
  updatedBy: person,
  createdAt: 1_764_000_000_000,
  updatedAt: 1_764_600_000_000,
});
const armSystem = { kind: 'sdof', quantity: 'accelerance', naturalFrequencyHz: 340, dampingRatio: 0.008, stiffnessNPerM: 250000 };

beforeEach(() => setWindowWidth(390));

/** Turns a chip or switch on and waits until it shows as on. */
async function click(role: 'radio' | 'switch', name: string) {
  await press(role, name);
  await waitFor(() => expect(screen.getByRole(role, { name }).getAttribute('aria-checked')).toBe('true'));
}

/** Turns a switch off and waits until it shows as off. */
async function switchOff(name: string) {
  await press('switch', name);
  await waitFor(() => expect(screen.getByRole('switch', { name }).getAttribute('aria-checked')).toBe('false'));
}

describe('scenario list', () => {
  test('an empty lab explains what a scenario will show', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe), [`GET ${page('scenarios')}`]: none });
    await renderApp('/scenarios');
    expect((await screen.findByTestId('empty-state')).textContent).toContain('No scenarios yet');
  });
});

describe('scenario editor', () => {
  test('a missing name and a band above fs/2 are refused with field errors; nothing is sent', async () => {
    const api = installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe), [`GET ${page('systems', 100)}`]: none });
    await renderApp('/scenarios/new');
    await typeInto('Band to (Hz)', '300'); // fs = 512 Hz, so fs/2 = 256 Hz
    await press('button', 'Save scenario');
    expect(await screen.findByText('Required')).toBeTruthy();
    expect(api.calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await typeInto('Name', 'Frame, too wide a band');
    await press('button', 'Save scenario');
    // The engine's rule, as the server's checkedByEngine applies it after the schema.
    expect(await screen.findByText('must be below fs/2 = 256 Hz')).toBeTruthy();
    expect(screen.getByLabelText('Band to (Hz)').getAttribute('aria-invalid')).toBe('true');
    expect(api.calls.filter((c) => c.method === 'POST')).toHaveLength(0);
  });

  test('switching the excitation to impact shows its pulse fields and a peak level', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe), [`GET ${page('systems', 100)}`]: none });
    await renderApp('/scenarios/new');
    await click('radio', 'Impact');
    expect(await screen.findByLabelText('Half-sine pulse duration (s)')).toBeTruthy();
    expect(screen.queryByLabelText('Band to (Hz)')).toBeNull();
    expect(screen.getByRole('radio', { name: 'Peak force' }).getAttribute('aria-checked')).toBe('true');
    await click('radio', 'Random');
    expect(await screen.findByLabelText('Band to (Hz)')).toBeTruthy();
  });

  test('the preview simulates seed 1 in the browser and shows force and response with units', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedInAs(demoMe), [`GET ${page('systems', 100)}`]: none });
    await renderApp('/scenarios/new');
    // 64 s at 512 Hz: 32768 samples, of which the first 2048 are drawn.
    await waitFor(() => expect(screen.getByTestId('scenario-signals').textContent).toContain('The first 2048 of 32768 samples at 512 Hz'));
    await act(async () => {
      fireEvent.keyDown(await screen.findByTestId('scenario-signals-force'), { key: 'Home' });
    });
    await waitFor(() => expect(screen.getByTestId('scenario-signals-readout').textContent).toContain('0 s'));
    const readout = screen.getByTestId('scenario-signals-readout').textContent ?? '';
    expect(readout).toContain('0 s');
    expect(readout).toMatch(/Force.* N/);
    expect(readout).toMatch(/Response.* m/);
    expect(screen.getByTestId('scenario-frf-magnitude')).toBeTruthy();
  });

  test('noise moved to the force channel and a delay are saved as error sources', async () => {
    const version = { version: 1, name: 'Frame, force noise', note: '', author: person, createdAt: 1 };
    let saved: unknown;
    const api = installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${page('systems', 100)}`]: none,
      // The server answers with the stored version: the posted definition.
      [`POST ${lab}/scenarios`]: ({ body }) => {
        saved = { ...head('scn-new', 'Frame, force noise'), version, definition: (body as { definition: unknown }).definition };
        return { status: 201, body: saved };
      },
      [`GET ${lab}/scenarios/scn-new`]: () => ({ status: 200, body: saved }),
      [`GET ${lab}/scenarios/scn-new/versions`]: { status: 200, body: { items: [version] } },
    });
    await renderApp('/scenarios/new');
    await typeInto('Name', 'Frame, force noise');
    await switchOff('Noise on the response channel');
    await click('switch', 'Noise on the force channel');
    await typeInto('Signal-to-noise ratio (dB)', '15');
    await click('switch', 'Delay between the channels');
    await press('button', 'Save scenario');
    await waitFor(() => expect(window.location.pathname).toBe('/scenarios/scn-new'));
    const post = api.calls.find((c) => c.method === 'POST');
    const body = post?.body as { definition: { errors: Record<string, unknown>; name: string } };
    expect(body.definition.name).toBe('Frame, force noise');
    expect(body.definition.errors).toEqual({ inputNoise: { snrDb: 15 }, delayS: 0.0005 });
  });

  test("a saved scenario copies one of the lab's systems and links its CSV exports", async () => {
    const definition = {
      name: 'Arm, delay',
      system: { kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: 36, dampingRatio: 0.01, modalConstant: 0.03 }] },
      acquisition: { sampleRateHz: 4096, durationS: 8 },
      excitation: { kind: 'random', band: { lowHz: 20, highHz: 1500 }, level: { rmsN: 5 } },
      errors: { delayS: 0.0002 },
    };
    const record = { ...head('scn-arm', 'Arm, delay', 2), version: { version: 2, name: 'Arm, delay', note: '', author: person, createdAt: 1 }, definition };
    const system = { ...head('sys-arm', 'Drone motor arm', 3), version: { version: 3, name: 'Drone motor arm', note: '', author: person, createdAt: 1 }, definition: armSystem };
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${page('systems', 100)}`]: { status: 200, body: { items: [head('sys-arm', 'Drone motor arm', 3)], total: 1, limit: 100, offset: 0 } },
      [`GET ${lab}/systems/sys-arm`]: { status: 200, body: system },
      [`GET ${lab}/scenarios/scn-arm`]: { status: 200, body: record },
      [`GET ${lab}/scenarios/scn-arm/versions`]: { status: 200, body: { items: [record.version] } },
    });
    await renderApp('/scenarios/scn-arm');
    const summary = () => screen.getByTestId('scenario-system-summary').textContent;
    await waitFor(() => expect(summary()).toBe('Modal · receptance m/N · mode at 36.00 Hz'));
    // The lab's systems arrive after the editor: choose the arm once it is offered.
    const systemSelect = await waitFor(() => {
      const select = screen.getByTestId('system-select') as HTMLSelectElement;
      expect(Array.from(select.options, (o) => o.value)).toContain('sys-arm');
      return select;
    });
    await act(async () => {
      fireEvent.change(systemSelect, { target: { value: 'sys-arm' } });
    });
    await press('button', 'Use this system');
    expect(await screen.findByText('✓ Copied from Drone motor arm, version 3')).toBeTruthy();
    await waitFor(() => expect(summary()).toBe('Single mass · accelerance m/(N·s²) · mode at 340.0 Hz'));

    const exportLink = (testId: string) => within(screen.getByTestId('scenario-export')).getByTestId(testId).getAttribute('href');
    expect(exportLink('signals-csv')).toBe(`${lab}/scenarios/scn-arm/signals.csv?seed=1&version=2`);
    await typeInto('Seed', '17');
    await waitFor(() => expect(exportLink('signals-csv')).toBe(`${lab}/scenarios/scn-arm/signals.csv?seed=17&version=2`));
    expect(exportLink('exact-csv')).toBe(`${lab}/scenarios/scn-arm/exact.csv?version=2`);
  });
});
