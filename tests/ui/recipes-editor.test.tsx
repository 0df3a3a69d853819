/**
 * Recipes: field errors from the engine's recipe schema, the window figures computed live
 * (F. J. Harris, Proc. IEEE 66(1), 1978, Table I — values quoted from memory, compared within the
 * tolerances docs/engine.md gives), the Hv weighting note, the engine's advice for a scenario
 * (Δf ≤ B_r/4 with B_r = 2ζf_n: common practice), saving, and version differences.
 */
import { fireEvent, screen, waitFor, within } from '@testing-library/dom';
import { act } from 'react';
import frameOutputNoise from '@/scenarios/frame-output-noise.json';
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
const survey = {
  name: 'Frame survey, Hann 50 %',
  blockLength: 4096,
  window: 'hann',
  overlap: 0.5,
  averages: 'all',
  detrend: 'mean',
  estimator: 'H1',
  band: { lowHz: 20, highHz: 120 },
  scaling: 'density',
  tolerances: { magnitudeDb: 1 },
};

beforeEach(() => setWindowWidth(390));

/** Chooses a chip of a radio group and waits until it shows as chosen. */
async function pick(name: string) {
  await press('radio', name);
  await waitFor(() => expect(screen.getByRole('radio', { name }).getAttribute('aria-checked')).toBe('true'));
}

function figure(label: string): string {
  const row = within(screen.getByTestId('window-figures')).getByText(label).parentElement!;
  return row.textContent!.slice(label.length);
}

const session = { 'GET /api/v1/auth/session': signedInAs(demoMe), [`GET ${page('scenarios', 100)}`]: none };

describe('recipe editor', () => {
  test('an empty name, an overlap of 1 and a block of 1000 samples are refused by the schema', async () => {
    const api = installFakeApi(session);
    await renderApp('/recipes/new');
    await typeInto('Overlap', '1');
    await typeInto('Block length N (samples)', '1000');
    await press('button', 'Save recipe');
    expect(await screen.findByText('must not be empty')).toBeTruthy();
    expect(screen.getByText('must be in [0, 1)')).toBeTruthy();
    expect(screen.getByText('must be a power of two in [4, 16777216]')).toBeTruthy();
    expect(api.calls.filter((c) => c.method === 'POST')).toHaveLength(0);
  });

  test('the window figures follow the chosen window (Harris 1978)', async () => {
    installFakeApi(session);
    await renderApp('/recipes/new');
    await screen.findByTestId('window-figures');
    // Hann: ENBW 1.50 bins, scalloping loss 1.42 dB, highest side lobe −32 dB (−31.5), 16.7 % at 50 %.
    await waitFor(() => expect(figure('Equivalent noise bandwidth')).toBe('1.50 bins'));
    expect(figure('Scalloping loss')).toBe('1.42 dB');
    expect(Number(figure('Highest side lobe').replace(' dB', ''))).toBeCloseTo(-31.5, 0);
    expect(figure('Overlap correlation at 50 %')).toBe('16.7 %');
    await pick('Rectangular');
    // Rectangular: ENBW 1.00 bin, scalloping loss 3.92 dB, highest side lobe −13 dB, 50.0 % at 50 %.
    await waitFor(() => expect(figure('Equivalent noise bandwidth')).toBe('1 bins'));
    expect(figure('Scalloping loss')).toBe('3.92 dB');
    expect(Number(figure('Highest side lobe').replace(' dB', ''))).toBeCloseTo(-13.3, 0);
    expect(figure('Overlap correlation at 50 %')).toBe('50 %');
  });

  test('choosing Hv shows the weighting note and its weight field', async () => {
    installFakeApi(session);
    await renderApp('/recipes/new');
    await screen.findByRole('radio', { name: 'Hv (total least squares)' });
    expect(screen.queryByTestId('hv-note')).toBeNull();
    await pick('Hv (total least squares)');
    expect((await screen.findByTestId('hv-note')).textContent).toContain('depends on channel scaling');
    expect(screen.getByLabelText('Noise weight κ (response ÷ force)')).toBeTruthy();
  });

  test("the engine's advice for the frame scenario resolves a quarter of the narrowest half-power bandwidth", async () => {
    const scenario = { ...head('scn-frame', frameOutputNoise.name), version: { version: 1, name: frameOutputNoise.name, note: '', author: person, createdAt: 1 }, definition: frameOutputNoise };
    installFakeApi({
      'GET /api/v1/auth/session': signedInAs(demoMe),
      [`GET ${page('scenarios', 100)}`]: { status: 200, body: { items: [head('scn-frame', frameOutputNoise.name)], total: 1, limit: 100, offset: 0 } },
      [`GET ${lab}/scenarios/scn-frame`]: { status: 200, body: scenario },
    });
    await renderApp('/recipes/new');
    // The lab's scenarios arrive after the screen: choose the frame once it is offered.
    const scenarioSelect = await waitFor(() => {
      const select = screen.getByTestId('advice-scenario') as HTMLSelectElement;
      expect(Array.from(select.options, (o) => o.value)).toContain('scn-frame');
      return select;
    });
    await act(async () => {
      fireEvent.change(scenarioSelect, { target: { value: 'scn-frame' } });
    });
    await press('button', 'Advise');
    const advice = within(await screen.findByTestId('advice-figures'));
    // Narrowest mode: 46 Hz at ζ = 0.55 %, B_r = 2ζf_n = 0.506 Hz.
    expect(await advice.findByText('46.00 Hz, B_r 0.506 Hz')).toBeTruthy();
    const df = Number(advice.getByText('Line spacing Δf').parentElement!.textContent!.replace('Line spacing Δf', '').replace(' Hz', ''));
    expect(df).toBeLessThanOrEqual((2 * 0.0055 * 46) / 4);
    // fs/N = Δf with N a power of two.
    const n = 512 / df;
    expect(Math.log2(n) % 1).toBe(0);
    await press('button', 'Use these settings');
    await waitFor(() => expect((screen.getByLabelText('Block length N (samples)') as HTMLInputElement).value).toBe(String(n)));
  });

  test('the history shows what changed between two versions, field by field', async () => {
    const v1 = { ...head('rcp-survey', survey.name, 2), version: { version: 1, name: survey.name, note: 'first', author: person, createdAt: 1 }, definition: survey };
    const changed = { ...survey, window: 'flattop', tolerances: { magnitudeDb: 0.5 } };
    const v2 = { ...v1, version: { version: 2, name: survey.name, note: 'tighter', author: person, createdAt: 2 }, definition: changed };
    installFakeApi({
      ...session,
      [`GET ${lab}/recipes/rcp-survey`]: { status: 200, body: v2 },
      [`GET ${lab}/recipes/rcp-survey/versions`]: { status: 200, body: { items: [v2.version, v1.version] } },
      [`GET ${lab}/recipes/rcp-survey/versions/1`]: { status: 200, body: v1 },
      [`GET ${lab}/recipes/rcp-survey/versions/2`]: { status: 200, body: v2 },
    });
    await renderApp('/recipes/rcp-survey');
    const rows = () => within(screen.getByTestId('change-table')).getAllByRole('row').slice(1).map((r) => r.textContent);
    await waitFor(() => expect(rows()).toEqual(['windowChangedhannflattop', 'tolerances.magnitudeDbChanged10.5']));
    // The editor holds v2 (flat-top) before anything is typed.
    await waitFor(() => expect(screen.getByRole('radio', { name: 'Flat-top' }).getAttribute('aria-checked')).toBe('true'));
    // With unsaved changes in the editor, loading an older version asks first.
    await typeInto('Overlap', '0.75');
    await press('button', 'Load v1 into the editor');
    const dialog = within(await screen.findByRole('dialog', { name: 'Replace your changes with v1?' }));
    expect(screen.getByRole('radio', { name: 'Flat-top' }).getAttribute('aria-checked')).toBe('true');
    await act(async () => {
      fireEvent.click(dialog.getByRole('button', { name: 'Load v1' }));
    });
    await waitFor(() => expect(screen.getByRole('radio', { name: 'Hann' }).getAttribute('aria-checked')).toBe('true'));
    expect((screen.getByLabelText('Overlap') as HTMLInputElement).value).toBe('0.5');
  });
});
