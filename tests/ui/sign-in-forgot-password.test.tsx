import { screen, waitFor } from '@testing-library/dom';
import { renderApp, setWindowWidth } from './support/app';
import { installFakeApi, signedOut } from './support/fake-api';
import { press } from './support/form';

jest.mock('expo-font', () => ({ useFonts: () => [true, null] }));
jest.mock('react-native-web/dist/exports/useWindowDimensions', () => ({ __esModule: true, default: jest.fn() }));

beforeEach(() => setWindowWidth(390));

describe('sign-in: forgotten password', () => {
  test('the sign-in card links to the reset request form', async () => {
    installFakeApi({ 'GET /api/v1/auth/session': signedOut });
    await renderApp('/sign-in');
    const link = await screen.findByRole('link', { name: 'Forgot your password?' });
    expect(link.getAttribute('href')).toBe('/reset-password');

    await press('link', 'Forgot your password?');

    expect(await screen.findByTestId('reset-request-form')).toBeTruthy();
    await waitFor(() => expect(window.location.pathname).toBe('/reset-password'));
    expect(screen.getByRole('button', { name: 'Send the reset link' })).toBeTruthy();
  });
});
