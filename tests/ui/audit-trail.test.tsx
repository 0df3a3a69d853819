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
  test('an intact trail is said plainly, with the count, the checkpoint and the signatures, beside the entries and the export', async () => {
    installEvidenceApi({
      ...session(meAs('auditor')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: true, checked: 42, firstBroken: null, missing: 0, checkpoint: { events: 42, head: 'ab12cd34ef56ab78cd90ef12ab34cd56', at: Date.UTC(2026, 11, 5, 9, 30) }, signatures: 3 }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([])),
    });
    await renderApp('/audit');
    const result = await screen.findByTestId('integrity-result');
    expect(result.textContent).toContain('Intact');
    expect(result.textContent).toContain('The trail is intact: all 42 entries were checked against their keyed hashes.');
    expect(result.textContent).toContain('The newest checkpoint outside the database (2026-12-05 09:30 UTC) records 42 entries, head ab12cd34ef56ab78…');
    expect(result.textContent).toContain('3 signatures re-computed and matched with the trail.');
    expect((await screen.findByTestId('audit-list')).textContent).toContain('studies.finish');
    expect(screen.getByTestId('audit-count').textContent).toBe('Entries 1–2 of 2');
    expect(screen.getByTestId('audit-export').getAttribute('href')).toBe(lab('/audit/export'));
  });

  test('a broken trail names the first broken entry and what broke, with a word and not colour alone', async () => {
    const detail = 'Entry #9 does not match its keyed hash: it was changed after it was written, or its hash was made without the audit key.';
    installEvidenceApi({
      ...session(meAs('admin')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: false, checked: 9, firstBroken: { id: 9, reason: 'hash_mismatch', detail }, missing: 0, checkpoint: null, signatures: 0 }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([])),
    });
    await renderApp('/audit');
    const result = await screen.findByTestId('integrity-result');
    expect(result.textContent).toContain('Broken');
    expect(result.textContent).toContain(`The trail is broken at entry 9: an entry was changed. ${detail}`);
  });

  test('entries cut from the end are named by their count, with no entry to point at', async () => {
    const detail = 'The checkpoint of 2026-12-05 09:30:00 UTC recorded 42 entries, but the database holds 40: the last 2 are missing (removed, or an older backup was restored).';
    installEvidenceApi({
      ...session(meAs('auditor')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: false, checked: 40, firstBroken: { id: null, reason: 'missing_events', detail }, missing: 2, checkpoint: { events: 42, head: 'ff', at: Date.UTC(2026, 11, 5, 9, 30) }, signatures: 0 }),
      [`GET ${lab('/audit')}`]: ok(trail),
      [`GET ${lab('/members')}`]: ok(page([])),
    });
    await renderApp('/audit');
    const result = await screen.findByTestId('integrity-result');
    expect(result.textContent).toContain(`BrokenThe trail is broken: entries are missing at the end. ${detail}`);
  });

  test('filters go to the server; a day that is not YYYY-MM-DD is refused first', async () => {
    const api = installEvidenceApi({
      ...session(meAs('auditor')),
      [`GET ${lab('/audit/verify')}`]: ok({ ok: true, checked: 2, firstBroken: null, missing: 0, checkpoint: null, signatures: 0 }),
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
