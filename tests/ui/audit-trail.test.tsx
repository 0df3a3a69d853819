import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose, press, typeInto } from './support/form';
import { auditEvent, installEvidenceApi, lab, meAs, ok, page, session } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

const trail = { ...page([auditEvent(3, 'studies.finish'), auditEvent(2, 'studies.start')]), limit: 25 };

describe('audit trail', () => {
  test('an intact chain is said plainly, with the count checked, beside the entries and the export', async () => {
    installEvidenceApi({
      ...session(meAs('auditor')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: true, checked: 42, firstBroken: null }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([])),
    });
    await renderApp('/audit');
    const result = await screen.findByTestId('integrity-result');
    expect(result.textContent).toContain('Intact');
    expect(result.textContent).toContain('all 42 entries were checked');
    expect((await screen.findByTestId('audit-list')).textContent).toContain('studies.finish');
    expect(screen.getByTestId('audit-count').textContent).toBe('Entries 1–2 of 2');
    expect(screen.getByTestId('audit-export').getAttribute('href')).toBe(lab('/audit/export'));
  });

  test('a broken chain names the first broken entry and why, with a word and not colour alone', async () => {
    installEvidenceApi({
      ...session(meAs('admin')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: false, checked: 17, firstBroken: { id: 9, reason: 'hash_mismatch' } }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([])),
    });
    await renderApp('/audit');
    const result = await screen.findByTestId('integrity-result');
    expect(result.textContent).toContain('Broken');
    expect(result.textContent).toContain('broken at entry 9: its contents no longer match its stored hash');
  });

  test('filters go to the server; a day that is not YYYY-MM-DD is refused first', async () => {
    const api = installEvidenceApi({
      ...session(meAs('auditor')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: true, checked: 2, firstBroken: null }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([{ userId: 'user-analyst', email: 'analyst@harborridge.test', displayName: 'Tomas Lindqvist', role: 'analyst', joinedAt: 1 }])),
    });
    await renderApp('/audit');
    await screen.findByTestId('audit-list');
    await typeInto('Action', 'studies.*');
    await typeInto('From (UTC day)', '1 Dec');
    await press('button', 'Apply filters');
    expect(await screen.findByText('Use a date such as 2026-12-01')).toBeTruthy();
    expect(api.called('GET', lab('/audit')).at(-1)!.query.get('action')).toBeNull();
    await typeInto('From (UTC day)', '2026-11-01');
    await press('button', 'Apply filters');
    const lastAudit = () => api.called('GET', lab('/audit')).at(-1)!.query;
    await waitFor(() => expect(lastAudit().get('action')).toBe('studies.*'));
    const q = lastAudit();
    expect(q.get('from')).toBe('2026-11-01');
    expect(q.get('offset')).toBe('0');

    // "Who": one person, then "Anyone" again (the empty choice stays selectable).
    await choose('Who', 'user-analyst');
    await press('button', 'Apply filters');
    await waitFor(() => expect(lastAudit().get('actor')).toBe('user-analyst'));
    // (A new action too, so the answer is not the one cached for the same filters.)
    await typeInto('Action', 'studies.start');
    await choose('Who', '');
    await press('button', 'Apply filters');
    await waitFor(() => expect(lastAudit().get('action')).toBe('studies.start'));
    expect(lastAudit().get('actor')).toBeNull();
  });

  test('an analyst is told the trail is not for their role, and nothing is asked of the server', async () => {
    const api = installEvidenceApi({ ...session(meAs('analyst')) });
    await renderApp('/audit');
    expect((await screen.findByTestId('role-refused')).textContent).toContain('Not for your role');
    expect(api.called('GET', lab('/audit'))).toHaveLength(0);
  });
});
