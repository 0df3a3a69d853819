import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { choose, press } from './support/form';
import { headerColumns } from '@/shared/ui/screens/uploads/csv-header';
import { installEvidenceApi, lab, meAs, ok, page, session } from './studies-fixtures';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));
const csv = 'time_s,force_N,accel\n0,1,2\n0.001,1,2\n';
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => {
    const file = new Blob([csv], { type: 'text/csv' });
    // jsdom's Blob has no text(); the browser's has.
    Object.assign(file, { slice: () => ({ text: async () => csv }) });
    return { canceled: false, assets: [{ name: 'hammer.csv', file }] };
  }),
}));

const recipes = page([{ id: 'recipe-arm', labId: 'lab-harbor-ridge', name: 'Arm shaker, burst random', description: '', latestVersion: 2, createdBy: { id: 'u', displayName: 'T' }, updatedBy: { id: 'u', displayName: 'T' }, createdAt: 1, updatedAt: 1 }]);

beforeEach(() => {
  localStorage.clear();
  setWindowWidth(390);
});

test('CSV header names are split on commas, semicolons or tabs, with quoted names', () => {
  expect(headerColumns('time_s,"force, N",accel')).toEqual(['time_s', 'force, N', 'accel']);
  expect(headerColumns('a;b\tc')).toEqual(['a', 'b', 'c']);
  expect(headerColumns('"say ""hi""",x')).toEqual(['say "hi"', 'x']);
});

test('time data: the picked file’s columns are offered, a recipe is required, and the form goes as multipart', async () => {
  const api = installEvidenceApi({ ...session(meAs('analyst')), [`GET ${lab('/uploads')}`]: ok(page([])), [`GET ${lab('/recipes')}`]: ok(recipes), [`GET ${lab('/scenarios')}`]: ok(page([])) });
  await renderApp('/uploads');
  await press('button', 'Choose a CSV file');
  expect(await screen.findByText('hammer.csv · 3 columns')).toBeTruthy();
  await waitFor(() => expect((screen.getByLabelText('Time column (s)') as HTMLSelectElement).value).toBe('time_s'));
  await choose('Force column (input)', 'force_N');
  await choose('Response column (output)', 'accel');
  await press('button', 'Upload and process');
  expect(await screen.findByText('Choose a recipe')).toBeTruthy();
  expect(api.called('POST', lab('/uploads'))).toHaveLength(0);

  await choose('Recipe', 'recipe-arm');
  await press('button', 'Upload and process');
  await waitFor(() => expect(api.called('POST', lab('/uploads'))).toHaveLength(1));
  const sent = (globalThis.fetch as jest.Mock).mock.calls.find(([url, init]) => String(url) === lab('/uploads') && init?.method === 'POST')![1].body as FormData;
  const fields = ['kind', 'recipeId', 'inputColumn', 'outputColumn', 'timeColumn', 'sampleRateHz'].map((k) => [k, sent.get(k)]);
  expect(Object.fromEntries(fields)).toEqual({ kind: 'time-data', recipeId: 'recipe-arm', inputColumn: 'force_N', outputColumn: 'accel', timeColumn: 'time_s', sampleRateHz: null });
  expect((sent.get('file') as File).name).toBe('hammer.csv');
});

test('an upload the server refuses shows its reason', async () => {
  installEvidenceApi({
    ...session(meAs('analyst')), [`GET ${lab('/uploads')}`]: ok(page([])), [`GET ${lab('/recipes')}`]: ok(recipes), [`GET ${lab('/scenarios')}`]: ok(page([])),
    [`POST ${lab('/uploads')}`]: { status: 400, body: { error: { code: 'bad_file', message: 'Line 3, column accel: "x" is not a number.' } } },
  });
  await renderApp('/uploads');
  await press('button', 'Choose a CSV file');
  expect(await screen.findByText('hammer.csv · 3 columns')).toBeTruthy();
  await choose('Recipe', 'recipe-arm');
  await press('button', 'Upload and process');
  expect((await screen.findByTestId('upload-error')).textContent).toBe('Line 3, column accel: "x" is not a number.');
});
