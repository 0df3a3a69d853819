import { screen, waitFor, within } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose, press, typeInto } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, session, study, submission } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const person = { id: 'user-analyst', displayName: 'Tomas Lindqvist' };
const recipeSummary = { id: 'recipe-arm', labId: 'lab-harbor-ridge', name: 'Arm shaker, burst random', description: '', latestVersion: 2, createdBy: person, updatedBy: person, createdAt: 1, updatedAt: 2 };
const studiesList = [
  study({ id: 'study-1', name: 'Arm burst check', pass: true }),
  study({ id: 'study-2', name: 'Arm delay check', pass: false }),
  study({ id: 'study-9', name: 'Arm, version 2 check', recipe: { id: 'recipe-arm', version: 2, name: 'Arm shaker, burst random' }, pass: true }),
].map(({ scenarios: _omit, ...rest }) => rest);

const baseRoutes = () => ({
  ...session(meAs('analyst')),
  [`GET ${lab('/reviews')}`]: ok(page([])),
  [`GET ${lab('/recipes')}`]: ok(page([recipeSummary])),
  [`GET ${lab('/studies')}`]: ok({ items: studiesList, total: studiesList.length, limit: 200, offset: 0 }),
});

async function check(name: string) {
  await press('checkbox', name);
  await waitFor(() => expect(screen.getByRole('checkbox', { name }).getAttribute('aria-checked')).toBe('true'));
}

async function fillScope() {
  await typeInto('Structure type', 'drone motor arm');
  await typeInto('Band from (Hz)', '200');
  await typeInto('Band to (Hz)', '1000');
  await typeInto('Damping from (% of critical)', '0.5');
  await typeInto('Damping to (% of critical)', '1.2');
  await check('Burst random');
}

describe('submit a recipe for review', () => {
  test('the inbox links an analyst to the form', async () => {
    installEvidenceApi(baseRoutes());
    await renderApp('/reviews');
    await press('link', 'Submit a recipe for review');
    await waitFor(() => expect(screen.getByTestId('screen-title').textContent).toBe('Submit a recipe for review'));
    expect(window.location.pathname).toBe('/reviews/submit');
  });

  test('a reviewer has no link in the inbox', async () => {
    installEvidenceApi({ ...baseRoutes(), ...session(meAs('reviewer')) });
    await renderApp('/reviews');
    expect(await screen.findByTestId('screen-title')).toBeTruthy();
    expect(screen.queryByRole('link', { name: 'Submit a recipe for review' })).toBeNull();
  });

  test('an empty form shows the schema errors and sends nothing', async () => {
    const api = installEvidenceApi(baseRoutes());
    await renderApp('/reviews/submit');
    await press('button', 'Submit for review');
    expect(await screen.findByText('Choose the recipe')).toBeTruthy();
    expect(screen.getByText('Give at least one finished study as evidence')).toBeTruthy();
    expect(screen.getByText('Name the structure type')).toBeTruthy();
    expect(api.called('POST', lab('/reviews'))).toHaveLength(0);
  });

  test('only finished studies of the chosen version are offered; a failed criterion asks for a justification; success opens the submission', async () => {
    const api = installEvidenceApi({
      ...baseRoutes(),
      [`POST ${lab('/reviews')}`]: { status: 201, body: submission() },
      [`GET ${lab('/reviews/sub-1')}`]: ok(submission()),
      [`GET ${lab('/reviews/sub-1/evidence')}`]: { status: 404, body: { error: { code: 'not_found', message: 'not in this test' } } },
    });
    await renderApp('/reviews/submit');
    await choose('Recipe', 'recipe-arm');
    await choose('Version', '1');
    const offered = () => within(screen.getByTestId('submit-studies')).getAllByRole('checkbox').map((box) => box.getAttribute('aria-label'));
    await waitFor(() => expect(offered()).toEqual(['Arm burst check', 'Arm delay check']));

    await check('Arm burst check');
    await check('Arm delay check');
    await fillScope();
    await press('button', 'Submit for review');
    expect(await screen.findByText('A criterion of the evidence failed: say why the recipe is fit nonetheless (at least 20 characters)')).toBeTruthy();
    expect(api.called('POST', lab('/reviews'))).toHaveLength(0);

    await typeInto('Why the recipe is fit although a criterion failed', 'The delay scenario is outside the programme: cables are compensated.');
    await press('button', 'Submit for review');
    await waitFor(() => expect(window.location.pathname).toBe('/reviews/sub-1'));
    const [call] = api.called('POST', lab('/reviews'));
    expect(call.body).toEqual({
      recipe: { id: 'recipe-arm', version: 1 },
      studyIds: ['study-1', 'study-2'],
      scope: { structureType: 'drone motor arm', band: { lowHz: 200, highHz: 1000 }, dampingPercent: { min: 0.5, max: 1.2 }, excitations: ['burst-random'] },
      purpose: '',
      justification: 'The delay scenario is outside the programme: cables are compensated.',
    });
  });

  test("the server's refusal is shown in its words and the form stays", async () => {
    installEvidenceApi({
      ...baseRoutes(),
      [`POST ${lab('/reviews')}`]: { status: 422, body: { error: { code: 'scope_not_covered', message: 'The evidence does not cover the declared scope: no scenario reaches 1000 Hz.' } } },
    });
    await renderApp('/reviews/submit');
    await choose('Recipe', 'recipe-arm');
    await choose('Version', '1');
    await check('Arm burst check');
    await fillScope();
    await press('button', 'Submit for review');
    const refusal = await screen.findByTestId('submit-refusal');
    expect(refusal.getAttribute('role')).toBe('alert');
    expect(refusal.textContent).toContain('The evidence does not cover the declared scope: no scenario reaches 1000 Hz.');
    expect(window.location.pathname).toBe('/reviews/submit');
  });

  test('a band whose low end is above its high end is refused by the schema', async () => {
    const api = installEvidenceApi(baseRoutes());
    await renderApp('/reviews/submit');
    await choose('Recipe', 'recipe-arm');
    await choose('Version', '1');
    await check('Arm burst check');
    await fillScope();
    await typeInto('Band from (Hz)', '2000');
    await press('button', 'Submit for review');
    expect(await screen.findByText('lowHz must be below highHz')).toBeTruthy();
    expect(api.called('POST', lab('/reviews'))).toHaveLength(0);
  });
});
