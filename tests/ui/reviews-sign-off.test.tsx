import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { press, typeInto } from './support/form';
import { decided, evidence, installEvidenceApi, lab, meAs, ok, page, session, submission } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const reviewRoutes = (sub = submission()) => ({
  [`GET ${lab('/reviews/sub-1')}`]: ok(sub),
  [`GET ${lab('/reviews/sub-1/evidence')}`]: ok(evidence(sub)),
});

describe('reviews inbox', () => {
  test('with nothing pending the inbox says so', async () => {
    const api = installEvidenceApi({ ...session(meAs('reviewer')), [`GET ${lab('/reviews')}`]: ok(page([])) });
    await renderApp('/reviews');
    await waitFor(() => expect(screen.getByTestId('empty-state').textContent).toContain('Nothing waiting for review'));
    expect(api.called('GET', lab('/reviews'))[0].query.get('status')).toBe('pending');
  });

  test('a pending submission is listed with its scope and leads to its evidence', async () => {
    installEvidenceApi({ ...session(meAs('reviewer')), [`GET ${lab('/reviews')}`]: ok(page([submission()])), ...reviewRoutes() });
    await renderApp('/reviews');
    const row = await screen.findByRole('link', { name: 'Arm shaker, burst random v1' });
    expect(row.textContent).toContain('drone motor arm · 200–1000 Hz · ζ 0.5–1.2 %');
    expect(row.textContent).toContain('You may decide');
    await press('link', 'Arm shaker, burst random v1');
    const studies = await screen.findByTestId('evidence-studies');
    expect(window.location.pathname).toBe('/reviews/sub-1');
    expect(studies.textContent).toContain('Arm, burst random excitation (v1)');
    expect(studies.textContent).toContain('0.0267 dB');
    expect((await screen.findByTestId('coverage-checks')).textContent).toContain('Covered');
  });
});

describe('sign-off dialog', () => {
  test('an empty signature is refused by the schema, and nothing is sent', async () => {
    const api = installEvidenceApi({ ...session(meAs('reviewer')), ...reviewRoutes() });
    await renderApp('/reviews/sub-1');
    await press('button', 'Sign off…');
    const dialog = await screen.findByRole('dialog', { name: 'Sign off this recipe version' });
    await press('button', 'Sign and approve');
    expect(await within(dialog).findByText('Enter your password to sign')).toBeTruthy();
    expect(within(dialog).getByText('State what the signature means (at least 10 characters)')).toBeTruthy();
    expect(api.called('POST', lab('/reviews/sub-1/decision'))).toHaveLength(0);
  });

  test('approving sends password, meaning, comment and review period, then shows the signature', async () => {
    let current = submission();
    const api = installEvidenceApi({
      ...session(meAs('reviewer')),
      [`GET ${lab('/reviews/sub-1')}`]: () => ok(current),
      [`GET ${lab('/reviews/sub-1/evidence')}`]: () => ok(evidence(current)),
      [`POST ${lab('/reviews/sub-1/decision')}`]: () => ok((current = decided())),
    });
    await renderApp('/reviews/sub-1');
    await press('button', 'Sign off…');
    await typeInto('What your signature means', '  Approved as the lab standard for the arm ');
    await typeInto('Your password', 'e2e-demo-password-2026');
    await press('button', 'Sign and approve');
    await waitFor(() => expect(screen.getByTestId('decision-record').textContent).toContain(`signature sha256 ${'b'.repeat(64)}`));
    expect(screen.getByTestId('decision-record').textContent).toContain('Dana Whitcombe');
    const [call] = api.called('POST', lab('/reviews/sub-1/decision'));
    expect(call.body).toEqual({ decision: 'approved', password: 'e2e-demo-password-2026', meaning: 'Approved as the lab standard for the arm', comment: '', reviewMonths: 12 });
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    const record = screen.getByTestId('decision-record');
    expect(record.textContent).toContain('Dana Whitcombe');
    expect(record.textContent).toContain('reviewer@harborridge.test');
    expect(record.textContent).toContain('added by the operator (seeded or created outside Plumbline) on 2026-11-20, not by an invitation');
    expect(record.textContent).toContain(`signature sha256 ${'b'.repeat(64)}`);
  });

  test('a wrong password keeps the dialog open with the reason', async () => {
    installEvidenceApi({
      ...session(meAs('reviewer')), ...reviewRoutes(),
      [`POST ${lab('/reviews/sub-1/decision')}`]: { status: 401, body: { error: { code: 'bad_password', message: 'The password is not right; nothing was signed.' } } },
    });
    await renderApp('/reviews/sub-1');
    await press('button', 'Sign off…');
    await typeInto('What your signature means', 'Approved as the lab standard for the arm');
    await typeInto('Your password', 'not the password');
    await press('button', 'Sign and approve');
    expect((await screen.findByTestId('dialog-error')).textContent).toBe('The password is not right; nothing was signed.');
    expect(screen.getByRole('dialog', { name: 'Sign off this recipe version' })).toBeTruthy();
  });

  test('returning needs a reason of at least 10 characters and sends no password', async () => {
    const api = installEvidenceApi({ ...session(meAs('reviewer')), ...reviewRoutes(), [`POST ${lab('/reviews/sub-1/decision')}`]: ok(submission({ status: 'returned' })) });
    await renderApp('/reviews/sub-1');
    await press('button', 'Return…');
    await typeInto('Reason for returning it', 'short');
    await press('button', 'Return with this reason');
    expect(await screen.findByText('Give the reason for returning it (at least 10 characters)')).toBeTruthy();
    expect(api.called('POST', lab('/reviews/sub-1/decision'))).toHaveLength(0);
    await typeInto('Reason for returning it', 'Add a scenario with noise on the force channel.');
    await press('button', 'Return with this reason');
    await waitFor(() => expect(api.called('POST', lab('/reviews/sub-1/decision'))).toHaveLength(1));
    expect(api.called('POST', lab('/reviews/sub-1/decision'))[0].body).toEqual({ decision: 'returned', reason: 'Add a scenario with noise on the force channel.', comment: '' });
  });

  test('a reviewer who may not decide sees who is refused and why, the rule, and no sign-off button', async () => {
    const why = 'You started the evidence study "Arm burst check": a reviewer who produced none of the evidence must decide it.';
    installEvidenceApi({ ...session(meAs('reviewer')), ...reviewRoutes(submission({ blockedForYou: [why] })) });
    await renderApp('/reviews/sub-1');
    expect(await screen.findByText('Dana Whitcombe (reviewer@harborridge.test) may not decide this one')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Sign off…' })).toBeNull();
    expect(screen.getByTestId('blocked-reasons').textContent).toBe(why);
    expect(screen.getByTestId('independence-rule').textContent).toMatch(/^No one may decide a review who submitted it, .* within the last 30 days cannot decide one\.$/);
  });

  test('an analyst reads the evidence but gets no decision buttons', async () => {
    installEvidenceApi({ ...session(meAs('analyst')), ...reviewRoutes() });
    await renderApp('/reviews/sub-1');
    expect(await screen.findByTestId('evidence-studies')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Sign off…' })).toBeNull();
  });
});
