import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose, press, typeInto } from './support/form';
import { installEvidenceApi, lab, meAs, ok, page, session, standard } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

describe('standards register', () => {
  test('an empty register says what will appear there', async () => {
    installEvidenceApi({ ...session(meAs('auditor')), [`GET ${lab('/standards')}`]: ok(page([])) });
    await renderApp('/standards');
    await waitFor(() => expect(screen.getByTestId('empty-state').textContent).toContain('No approved standards yet'));
  });

  test('the scope filters go to the server as its query, and an empty answer says no standard covers it', async () => {
    const api = installEvidenceApi({
      ...session(meAs('analyst')),
      [`GET ${lab('/standards')}`]: ({ url }) => ok(page(url.includes('structureType') ? [] : [standard()])),
    });
    await renderApp('/standards');
    expect((await screen.findByTestId('standard-list')).textContent).toContain('drone motor arm · 200–1000 Hz · ζ 0.5–1.2 %');
    await typeInto('Structure type', 'frame');
    await typeInto('Band from (Hz)', '20');
    await typeInto('to (Hz)', '120');
    await typeInto('Damping of the structure (% of critical)', '0.8');
    await choose('Excitation', 'random');
    await press('button', 'Apply filters');
    await waitFor(() => expect(screen.getByTestId('empty-state').textContent).toContain('No standard covers this'));
    const last = api.called('GET', lab('/standards')).at(-1)!;
    expect(Object.fromEntries(last.query)).toEqual({ structureType: 'frame', lowHz: '20', highHz: '120', dampingPercent: '0.8', excitation: 'random', status: 'active', limit: '50' });
  });

  test('a band that is not a number is refused before any query', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('/standards')}`]: ok(page([standard()])) });
    await renderApp('/standards');
    await screen.findByTestId('standard-list');
    const before = api.called('GET', lab('/standards')).length;
    await typeInto('Band from (Hz)', 'twenty');
    await press('button', 'Apply filters');
    expect(await screen.findByText('Enter a number')).toBeTruthy();
    expect(api.called('GET', lab('/standards'))).toHaveLength(before);
  });

  test('a standard shows its signature and report; an admin’s retirement asks first and needs the reason', async () => {
    const api = installEvidenceApi({
      ...session(meAs('admin')),
      [`GET ${lab('/standards/std-1')}`]: ok(standard()),
      [`POST ${lab('/standards/std-1/retire')}`]: ok(standard({ status: 'retired', ended: { at: 1, by: null, reason: 'Replaced by the impact standard.' } })),
    });
    await renderApp('/standards/std-1');
    const detail = await screen.findByTestId('standard-detail');
    expect(detail.textContent).toContain('Meaning: Approved as the lab standard for the arm');
    // The signer by name, e-mail and how the account came to the lab, and the rule it was checked against.
    expect(detail.textContent).toContain('Dana Whitcombe (reviewer@harborridge.test)');
    expect(detail.textContent).toContain('added by the operator (seeded or created outside Plumbline) on 2026-11-20, not by an invitation');
    expect(screen.getByTestId('signature-rule').textContent).toMatch(/^No one may decide a review who submitted it/);
    expect(screen.getByTestId('standard-report').getAttribute('href')).toBe('/reports/standard/std-1');
    await press('button', 'Retire this standard…');
    expect(await screen.findByRole('dialog', { name: 'Retire this standard?' })).toBeTruthy();
    await typeInto('Reason', 'Replaced by the impact standard.');
    await press('button', 'Retire it');
    await waitFor(() => expect(api.called('POST', lab('/standards/std-1/retire'))).toHaveLength(1));
    expect(api.called('POST', lab('/standards/std-1/retire'))[0].body).toEqual({ reason: 'Replaced by the impact standard.' });
  });

  test('an auditor gets no retire button', async () => {
    installEvidenceApi({ ...session(meAs('auditor')), [`GET ${lab('/standards/std-1')}`]: ok(standard()) });
    await renderApp('/standards/std-1');
    expect(await screen.findByTestId('standard-detail')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Retire this standard…' })).toBeNull();
  });
});
