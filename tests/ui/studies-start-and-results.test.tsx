import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose, press, typeInto } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, results, runningStudy, session, study } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

const summary = (id: string, name: string, description = '') => ({
  id, labId: 'lab-harbor-ridge', name, description, latestVersion: 1, createdBy: { id: 'u', displayName: 'Tomas Lindqvist' }, updatedBy: { id: 'u', displayName: 'Tomas Lindqvist' }, createdAt: 1, updatedAt: 1,
});
const inputs = {
  [`GET ${lab('/recipes')}`]: ok(page([summary('recipe-arm', 'Arm shaker, burst random')])),
  [`GET ${lab('/scenarios')}`]: ok(page([summary('sc-burst', 'Arm, burst random excitation'), summary('sc-delay', 'Arm, delay between the channels')])),
};

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

async function tick(name: string) {
  await press('checkbox', name);
  await waitFor(() => expect(screen.getByRole('checkbox', { name }).getAttribute('aria-checked')).toBe('true'));
}

describe('starting a study', () => {
  test('an empty form shows the server schema’s errors in plain words and sends nothing', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), ...inputs });
    await renderApp('/studies/new');
    await press('button', 'Start the study');
    expect(await screen.findByText('Give a name')).toBeTruthy();
    expect(screen.getByText('Choose a recipe')).toBeTruthy();
    expect(screen.getByText('Tick at least one scenario')).toBeTruthy();
    expect(api.called('POST', lab('/studies'))).toHaveLength(0);
  });

  test('seeds above the server’s limit of 1000 per scenario are refused in plain words', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), ...inputs });
    await renderApp('/studies/new');
    await typeInto('Study name', 'Too big');
    await choose('Recipe', 'recipe-arm');
    await tick('Arm, burst random excitation');
    await tick('Arm, delay between the channels');
    await typeInto('Seeds per scenario', '1001');
    await press('button', 'Start the study');
    expect(await screen.findByText('Enter a whole number of seeds, 1 to 1000')).toBeTruthy();
    expect(api.called('POST', lab('/studies'))).toHaveLength(0);
  });

  test('a valid form posts recipe, scenarios in the ticked order, seeds and base seed, then opens the study', async () => {
    const started = runningStudy(0);
    const api = installEvidenceApi({
      ...session(meAs('analyst')), ...inputs,
      [`POST ${lab('/studies')}`]: { status: 202, body: started },
      [`GET ${lab('/studies/study-1')}`]: ok(started),
      [`GET ${lab('/studies')}`]: ok(page([started])),
    });
    await renderApp('/studies/new');
    await typeInto('Study name', 'Arm burst check');
    await choose('Recipe', 'recipe-arm');
    await tick('Arm, delay between the channels');
    await tick('Arm, burst random excitation');
    await typeInto('Seeds per scenario', '2');
    await waitFor(() => expect(screen.getByTestId('study-runs').textContent).toBe('4 runs of at most 5000'));
    await press('button', 'Start the study');
    await waitFor(() => expect(window.location.pathname).toBe('/studies/study-1'));
    const [call] = api.called('POST', lab('/studies'));
    expect(call.body).toEqual({ name: 'Arm burst check', recipe: { id: 'recipe-arm' }, scenarios: [{ id: 'sc-delay' }, { id: 'sc-burst' }], seeds: 2, baseSeed: 1 });
  });

  test('a reviewer is told that only analysts start studies', async () => {
    installEvidenceApi({ ...session(meAs('reviewer')), ...inputs });
    await renderApp('/studies/new');
    expect((await screen.findByTestId('role-refused')).textContent).toContain('Not for your role');
  });
});

describe('a study and its results', () => {
  test('the list shows its empty state when the lab has no studies', async () => {
    installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('/studies')}`]: ok(page([])) });
    await renderApp('/studies');
    await waitFor(() => expect(screen.getByTestId('empty-state').textContent).toContain('No studies run yet'));
  });

  test('a running study’s row in the list follows the study, and the list is fetched again when it ends', async () => {
    let detail = runningStudy(1);
    const api = installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/studies')}`]: () => ok(page([detail.status === 'running' ? runningStudy(1) : detail])),
      [`GET ${lab('/studies/study-1')}`]: () => ok(detail),
    });
    await renderApp('/studies');
    const bar = () => within(screen.getByTestId('study-list')).queryByRole('progressbar');
    await waitFor(() => expect(bar()!.getAttribute('aria-valuenow')).toBe('1'));
    detail = runningStudy(3);
    // The row polls the study: it shows the new count when the next answer arrives.
    await waitFor(() => expect(bar()!.getAttribute('aria-valuenow')).toBe('3'));
    const listCalls = api.called('GET', lab('/studies')).length;
    detail = study();
    await waitFor(() => expect(screen.getByTestId('study-list').textContent).toContain('Fail'));
    expect(api.called('GET', lab('/studies')).length).toBeGreaterThan(listCalls);
    expect(bar()).toBeNull();
  });

  test('a failing server shows an error with a way to try again', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('/studies/study-1')}`]: { status: 500, body: { error: { code: 'internal', message: 'The database is busy.' } } } });
    await renderApp('/studies/study-1');
    // Server errors are retried twice (1 s, then 2 s) before the screen says so.
    await waitFor(() => expect(screen.getByTestId('error-state').textContent).toContain('The database is busy.'));
    expect(api.called('GET', lab('/studies/study-1'))).toHaveLength(3);
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });

  test('a running study shows runs done and the ETA, polls without EventSource, then shows the matrix', async () => {
    let answer = runningStudy(1);
    const api = installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/studies/study-1')}`]: () => ok(answer),
      [`GET ${lab('/studies/study-1/results')}`]: ok(results),
    });
    await renderApp('/studies/study-1');
    const bar = await screen.findByRole('progressbar', { name: 'Runs done' });
    expect(bar.getAttribute('aria-valuenow')).toBe('1');
    expect(screen.getByTestId('progress-runs').textContent).toBe('1 / 4 runs · 25 %');
    expect(screen.getByTestId('progress-eta').textContent).toBe('about 1 min 15 s left');
    expect(globalThis.EventSource).toBeUndefined();
    answer = study();
    // The screen polls the study; once it has finished, the results replace the progress.
    const matrix = await screen.findByTestId('results-matrix');
    expect(api.called('GET', lab('/studies/study-1')).length).toBeGreaterThanOrEqual(2);
    const burst = within(matrix).getByRole('link', { name: 'Arm, burst random excitation: pass' });
    expect(burst.textContent).toContain('0.0267 dB');
    expect(burst.textContent).toContain('limit ≤ 0.500 dB');
    const delay = within(matrix).getByRole('link', { name: 'Arm, delay between the channels: fail' });
    expect(delay.textContent).toContain('Fail');
    expect(delay.textContent).toContain('180°');
    expect(screen.getByTestId('results-summary').textContent).toBe('3 of 6 criteria passed over 2 scenarios. Choose a scenario for its plots.');
    expect(screen.getByTestId('csv-results').getAttribute('href')).toBe(lab('/studies/study-1/results.csv'));
  });

  test('cancel asks first, and only the confirmation sends it', async () => {
    const api = installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/studies/study-1')}`]: ok(runningStudy(2)),
      [`POST ${lab('/studies/study-1/cancel')}`]: { status: 202, body: study({ status: 'cancelled', pass: null, progress: { status: 'cancelled', done: 2, failed: 0, total: 4, currentScenario: null, etaSeconds: null } }) },
    });
    await renderApp('/studies/study-1');
    await press('button', 'Cancel study');
    const dialog = await screen.findByRole('dialog', { name: 'Cancel this study?' });
    expect(dialog.textContent).toContain('Runs already done (2 of 4) are kept');
    await press('button', 'Keep it running');
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(api.called('POST', lab('/studies/study-1/cancel'))).toHaveLength(0);
    await press('button', 'Cancel study');
    await press('button', 'Cancel the study');
    await waitFor(() => expect(screen.getByTestId('study-status').textContent).toBe('Cancelled'));
    expect(api.called('POST', lab('/studies/study-1/cancel'))).toHaveLength(1);
  });
});
