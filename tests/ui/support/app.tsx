/** Renders the real app/ routes at a URL, in a window of a given width. */
import { ExpoRoot } from 'expo-router';
import { getMockContext } from 'expo-router/testing-library';
import path from 'node:path';
import { renderDom } from './dom';

const appDir = path.resolve(__dirname, '../../../app');

/**
 * Window width as the app sees it. On the web, babel-preset-expo compiles
 * `import { useWindowDimensions } from 'react-native'` to react-native-web's own module, so each
 * test file mocks that module (a jest.mock line at its top) and this sets what it returns.
 */
export function setWindowWidth(width: number) {
  const module = jest.requireMock<{ default: jest.Mock }>('react-native-web/dist/exports/useWindowDimensions');
  module.default.mockReturnValue({ width, height: 800, scale: 1, fontScale: 1 });
}

/**
 * Mounts the app at `url`. It returns at once: the session and the screen's data arrive later, so
 * the test waits for what it reads (`await screen.findBy…`).
 */
export async function renderApp(url: string) {
  process.env.EXPO_ROUTER_IMPORT_MODE = 'sync';
  window.history.replaceState(null, '', url);
  return renderDom(<ExpoRoot context={getMockContext(appDir)} location={url} />);
}
