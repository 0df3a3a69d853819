/**
 * The what-if bench screen: it opens on a built-in scenario and shows the plots and the time the
 * browser took; moving the noise from the response to the force changes H1 the way Bendat &
 * Piersol say (J. S. Bendat & A. G. Piersol, Random Data, 4th ed., ch. 9, quoted from memory):
 * with uncorrelated input noise of power ratio r = Gnn/Gxx, |H1| = |H|/(1 + r), the coherence is
 * γ² = 1/(1 + r), and the normalised random error of |Ĥ1| over n_d averages is
 * ε = sqrt(1 − γ²)/(|γ|·sqrt(2·n_d)); a scenario the bench cannot run is refused in words.
 */
import { fireEvent, screen, waitFor, within } from '@testing-library/dom';
import { act } from 'react';
import armImpact from '@/scenarios/arm-impact-exponential.json';
import { renderApp, setWindowWidth } from './support/app';
import { demoMe, installFakeApi, signedInAs } from './support/fake-api';
import { choose } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const lab = '/api/v1/labs/lab-harbor-ridge';
const listPath = `${lab}/scenarios?limit=100&offset=0&sort=updatedAt&order=desc`;
const person = { id: 'user-analyst', displayName: 'Mira Okafor' };
const impactHead = { id: 'scn-impact', labId: 'lab-harbor-ridge', name: armImpact.name, description: '', latestVersion: 1, createdBy: person, updatedBy: person, createdAt: 1, updatedAt: 1 };

beforeEach(() => setWindowWidth(1280));

function fact(label: string): string {
  const row = within(screen.getByTestId('what-if-summary')).getByText(label).parentElement!;
  return row.textContent!.slice(label.length);
}

function h1Path(): string {
  const frame = screen.getByTestId('what-if-frf-magnitude');
  return Array.from(frame.querySelectorAll('path')).find((p) => p.getAttribute('stroke') === '#1F7A8C')!.getAttribute('d')!;
}

/** The error plot's read-out: the line's frequency (Hz) and H1's magnitude error there (dB). */
function errorReadout(): { hz: number; db: number } {
  const text = screen.getByTestId('what-if-error-readout').textContent ?? '';
  const number = (pattern: RegExp) => Number(pattern.exec(text)![1].replace(/−/g, '-'));
  return { hz: number(/Frequency(\S+) Hz/), db: number(/H1 error(\S+) dB/) };
}

test('the bench runs in the browser and the plots follow the noise from response to force', async () => {
  installFakeApi({
    'GET /api/v1/auth/session': signedInAs(demoMe),
    [`GET ${listPath}`]: { status: 200, body: { items: [impactHead], total: 1, limit: 100, offset: 0 } },
  });
  await renderApp('/bench/what-if');
  expect((await screen.findByTestId('what-if-time')).textContent).toMatch(/^Simulated and processed 65536 samples in \d+ ms in this browser\.$/);
  expect(screen.getByRole('radio', { name: 'On the response' }).getAttribute('aria-checked')).toBe('true');
  const before = { path: h1Path(), worst: fact('Largest |magnitude error| of H1 in the band') };
  expect(screen.getByTestId('what-if-coherence-frame')).toBeTruthy();
  expect(screen.getByTestId('what-if-error-frame')).toBeTruthy();

  await act(async () => {
    fireEvent.click(screen.getByRole('radio', { name: 'On the force' }));
  });
  await waitFor(() => expect(h1Path()).not.toBe(before.path));
  await waitFor(() => expect(fact('Largest |magnitude error| of H1 in the band')).not.toBe(before.worst));

  // 20 dB SNR on the force over the band: r = 0.01, so H1 reads low by 20·log10(1/1.01) = −0.086 dB
  // at every line, with coherence γ² = 1/1.01 and a random error per line of
  // ε = sqrt(1 − γ²)/(|γ|·sqrt(2·n_d)) ≈ 0.013 (0.11 dB) at n_d ≈ 29 averages: one line cannot tell
  // the bias from the scatter. So the read-out is stepped across the band (ArrowRight moves 1 % of
  // the axis, 1.4 Hz, so the lines read are ~11 lines apart and nearly independent) and the lines
  // away from the three modes (36–53 Hz) are averaged: the mean of n lines has a random error of
  // ε/sqrt(n) ≈ 0.015 dB, so ±4 of those around −0.086 dB excludes 0 (no bias) by far.
  const r = 10 ** (-20 / 10);
  const biasDb = 20 * Math.log10(1 / (1 + r));
  const coherence = 1 / (1 + r);
  const averages = Number(/\(([\d.]+)\)/.exec(fact('Blocks averaged (equivalent independent)'))![1]);
  const perLineDb = (20 / Math.LN10) * (Math.sqrt(1 - coherence) / (Math.sqrt(coherence) * Math.sqrt(2 * averages)));
  const frame = screen.getByTestId('what-if-error-frame');
  const errors: number[] = [];
  const walk = async (start: 'Home' | 'End', step: 'ArrowRight' | 'ArrowLeft', keep: (hz: number) => boolean) => {
    await act(async () => {
      fireEvent.keyDown(frame, { key: start });
    });
    for (;;) {
      const { hz, db } = errorReadout();
      if (!keep(hz)) return;
      errors.push(db);
      await act(async () => {
        fireEvent.keyDown(frame, { key: step });
      });
    }
  };
  await walk('Home', 'ArrowRight', (hz) => hz < 25); // 10 Hz upwards, below the first mode
  await walk('End', 'ArrowLeft', (hz) => hz > 80); // 150 Hz downwards, above the last mode
  expect(errors.length).toBeGreaterThan(50);
  const mean = errors.reduce((a, b) => a + b, 0) / errors.length;
  const spread = Math.sqrt(errors.reduce((a, b) => a + (b - mean) ** 2, 0) / (errors.length - 1));
  expect(biasDb).toBeCloseTo(-0.0864, 4);
  expect(Math.abs(mean - biasDb)).toBeLessThan((4 * perLineDb) / Math.sqrt(errors.length));
  // The scatter itself is the predicted one (within ±50 %): output noise would scatter H1 by dB
  // where the response is weak, and no noise would leave almost none.
  expect(spread).toBeGreaterThan(0.5 * perLineDb);
  expect(spread).toBeLessThan(1.5 * perLineDb);
});

test("a lab scenario with impact excitation is refused in words", async () => {
  installFakeApi({
    'GET /api/v1/auth/session': signedInAs(demoMe),
    [`GET ${listPath}`]: { status: 200, body: { items: [impactHead], total: 1, limit: 100, offset: 0 } },
    [`GET ${lab}/scenarios/scn-impact`]: { status: 200, body: { ...impactHead, version: { version: 1, name: armImpact.name, note: '', author: person, createdAt: 1 }, definition: armImpact } },
  });
  await renderApp('/bench/what-if');
  await choose("Or one of the lab's scenarios", 'scn-impact');
  expect(await screen.findByText(/The bench handles stationary excitation/)).toBeTruthy();
});
