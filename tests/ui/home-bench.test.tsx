import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, runningStudy, session, standard, study, submission } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const byStatus = (answers: Record<string, unknown[]>) => ({ url }: { url: string }) => ok(page(answers[new URL(url, 'http://x').searchParams.get('status') ?? ''] ?? []));

describe('home (bench)', () => {
  test('each section has its own empty state', async () => {
    installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/studies')}`]: ok(page([])),
      [`GET ${lab('/reviews')}`]: ok(page([])),
      [`GET ${lab('/standards')}`]: ok(page([])),
    });
    await renderApp('/');
    await waitFor(() => expect(screen.getByTestId('home-running').textContent).toContain('No study is running'));
    await waitFor(() => expect(screen.getByTestId('home-results').textContent).toContain('No results yet'));
    await waitFor(() => expect(screen.getByTestId('home-reviews').textContent).toContain('Nothing is waiting for review'));
    await waitFor(() => expect(screen.getByTestId('home-due').textContent).toContain('None due in the next 60 days'));
  });

  test('running studies show their progress, results their verdicts, and a reviewer sees what waits for them', async () => {
    const api = installEvidenceApi({
      ...session(meAs('reviewer')),
      [`GET ${lab('/studies')}`]: byStatus({ running: [runningStudy(3)], finished: [study()] }),
      [`GET ${lab('/reviews')}`]: ok(page([submission(), submission({ id: 'sub-2', blockedForYou: ['You submitted it.'] })])),
      [`GET ${lab('/standards')}`]: ok(page([standard()])),
    });
    await renderApp('/');
    await waitFor(() => expect(within(screen.getByTestId('home-running')).getByRole('progressbar').getAttribute('aria-valuenow')).toBe('3'));
    expect(await within(screen.getByTestId('home-results')).findByText('Fail')).toBeTruthy();
    await waitFor(() => expect(screen.getByTestId('home-reviews').textContent).toContain('Reviews waiting for you'));
    expect(within(screen.getByTestId('home-reviews')).getAllByRole('link', { name: 'Arm shaker, burst random v1' })).toHaveLength(1);
    await waitFor(() => expect(screen.getByTestId('home-due').textContent).toContain('Review due'));
    const due = api.called('GET', lab('/standards'))[0].query.get('dueBefore');
    expect(Number(due)).toBeGreaterThan(Date.now() + 59 * 86_400_000);
  });

  test('someone in two labs can switch; the choice is kept and every lab query follows it', async () => {
    const me = meAs('analyst', [{ labId: 'lab-quarry', labName: 'Quarry Road Vibration Lab', role: 'reviewer' }]);
    const api = installEvidenceApi({
      ...session(me),
      [`GET ${lab('/studies')}`]: ok(page([])), [`GET ${lab('/reviews')}`]: ok(page([])), [`GET ${lab('/standards')}`]: ok(page([])),
      'GET /api/v1/labs/lab-quarry/studies': ok(page([])), 'GET /api/v1/labs/lab-quarry/reviews': ok(page([])), 'GET /api/v1/labs/lab-quarry/standards': ok(page([])),
    });
    await renderApp('/');
    await choose('Lab', 'lab-quarry');
    await waitFor(() => expect(screen.getByTestId('header-user').textContent).toContain('Reviewer'));
    expect(localStorage.getItem('plumbline.selectedLab')).toBe('lab-quarry');
    await waitFor(() => expect(api.called('GET', '/api/v1/labs/lab-quarry/reviews').length).toBeGreaterThan(0));
  });
});
