import { screen, waitFor, within } from '@testing-library/dom';
import { reverifySchema } from '@/shared/api/approval';
import { renderApp, setWindowWidth } from './support/app';
import { press } from './support/form';
import { installEvidenceApi, lab, meAs, ok, session, standard } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const REVERIFY = lab('/standards/std-1/reverify');

const outcome = (over: Record<string, unknown> = {}) =>
  reverifySchema.parse({
    standardId: 'std-1', engineVersion: '1.1.0', storedEngineVersions: ['1.0.0'], verdict: 'identical', tolerance: 1e-12, runs: 8,
    largestChange: null,
    lines: [
      { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'magnitude error (dB)', values: 512, verdict: 'identical', maxDifference: 0, atHz: null, error: null },
      { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'coherence', values: 512, verdict: 'identical', maxDifference: 0, atHz: null, error: null },
    ],
    at: Date.UTC(2026, 11, 1, 12),
    ...over,
  });

/** Holds the reverify answer back until release() so the busy state can be seen. */
function holdReverify() {
  const inner = globalThis.fetch;
  let release = () => {};
  const gate = new Promise<void>((resolve) => (release = resolve));
  globalThis.fetch = (async (input: RequestInfo | URL, init?: RequestInit) => {
    if (String(input) === REVERIFY) await gate;
    return inner(input, init);
  }) as typeof fetch;
  return () => release();
}

describe("re-verification on today's engine", () => {
  test('an analyst is asked first, sees progress while it runs, then reads "identical"', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('/standards/std-1')}`]: ok(standard()), [`POST ${REVERIFY}`]: ok(outcome()) });
    const release = holdReverify();
    await renderApp('/standards/std-1');

    await press('button', "Re-run on today's engine…");
    const dialog = await screen.findByRole('dialog', { name: "Re-run this standard's evidence?" });
    expect(dialog.textContent).toContain('can take a while');
    expect(api.called('POST', REVERIFY)).toHaveLength(0);

    await press('button', 'Re-run it');
    expect((await screen.findByTestId('reverify-progress')).textContent).toContain('Re-running every study');
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(screen.getByRole('button', { name: "Re-run on today's engine…" }).getAttribute('aria-disabled')).toBe('true');

    release();
    const words = (await screen.findByTestId('reverify-outcome')).textContent;
    expect(api.called('POST', REVERIFY)).toHaveLength(1);
    await waitFor(() => expect(screen.queryByTestId('reverify-progress')).toBeNull());
    expect(screen.getByRole('button', { name: "Re-run on today's engine…" }).getAttribute('aria-disabled')).not.toBe('true');
    expect(words).toContain('Identical: every stored number came back bit for bit over 8 runs on engine 1.1.0 (evidence made on 1.0.0).');
  });

  test('within tolerance says so and names where the largest difference is', async () => {
    installEvidenceApi({
      ...session(meAs('admin')),
      [`GET ${lab('/standards/std-1')}`]: ok(standard()),
      [`POST ${REVERIFY}`]: ok(outcome({
        verdict: 'within-tolerance',
        largestChange: { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'coherence', frequencyHz: 412.5, stored: 0.998, recomputed: 0.998, difference: 3e-15 },
      })),
    });
    await renderApp('/standards/std-1');
    await press('button', "Re-run on today's engine…");
    await press('button', 'Re-run it');
    const words = (await screen.findByTestId('reverify-outcome')).textContent;
    expect(words).toContain('Within 1.00e-12: no number moved by more than 1.00e-12 relative');
    expect(words).toContain('Largest change: coherence in Arm, burst random excitation at 412.5 Hz');
    expect(words).toContain('difference 3.00e-15');
  });

  test('a changed result counts the changed lines and shows the largest change with both values', async () => {
    installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/standards/std-1')}`]: ok(standard()),
      [`POST ${REVERIFY}`]: ok(outcome({
        verdict: 'changed',
        largestChange: { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'magnitude error (dB)', frequencyHz: 640, stored: 0.0267, recomputed: 0.0301, difference: 0.0034 },
        lines: [
          { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'magnitude error (dB)', values: 512, verdict: 'changed', maxDifference: 0.0034, atHz: 640, error: null },
          { studyId: 'study-1', scenario: 'Arm, burst random excitation', quantity: 'coherence', values: 512, verdict: 'identical', maxDifference: 0, atHz: null, error: null },
        ],
      })),
    });
    await renderApp('/standards/std-1');
    await press('button', "Re-run on today's engine…");
    await press('button', 'Re-run it');
    const panel = await screen.findByTestId('reverify-outcome');
    expect(panel.textContent).toContain('Changed: 1 of 2 compared lines differ by more than 1.00e-12');
    expect(within(panel).getByText(/Largest change: magnitude error \(dB\) in Arm, burst random excitation at 640 Hz, stored 0.026700, now 0.030100 \(difference 0.00340\)/)).toBeTruthy();
  });

  test("a refusal from the server is shown in its words", async () => {
    installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/standards/std-1')}`]: ok(standard()),
      [`POST ${REVERIFY}`]: { status: 409, body: { error: { code: 'evidence_missing', message: 'A study of the evidence has no stored results to compare.' } } },
    });
    await renderApp('/standards/std-1');
    await press('button', "Re-run on today's engine…");
    await press('button', 'Re-run it');
    expect((await screen.findByTestId('reverify-error')).textContent).toContain('A study of the evidence has no stored results to compare.');
  });

  test.each(['reviewer', 'auditor'] as const)('signed in as %s, there is no re-run action', async (role) => {
    installEvidenceApi({ ...session(meAs(role)), [`GET ${lab('/standards/std-1')}`]: ok(standard()) });
    await renderApp('/standards/std-1');
    expect(await screen.findByTestId('standard-detail')).toBeTruthy();
    expect(screen.queryByRole('button', { name: "Re-run on today's engine…" })).toBeNull();
  });
});
