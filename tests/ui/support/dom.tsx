/**
 * Renders into jsdom with react-dom, so tests see the DOM that react-native-web gives a browser
 * (roles, aria-* and <input>s). @testing-library/react-native queries host components named
 * Text/View and finds nothing in react-native-web's <div>s, so the web project uses
 * @testing-library/dom on the real DOM instead.
 */
import { act, type ReactElement } from 'react';
import { createRoot, type Root } from 'react-dom/client';

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const mounted: { root: Root; container: HTMLElement }[] = [];

export async function renderDom(ui: ReactElement) {
  const container = document.createElement('div');
  document.body.appendChild(container);
  const root = createRoot(container);
  mounted.push({ root, container });
  await act(async () => {
    root.render(ui);
  });
  return { container };
}

/** Lets pending promises, timers of 0 ms and React updates settle. */
export async function settle(rounds = 3) {
  for (let i = 0; i < rounds; i++) {
    await act(async () => {
      await new Promise((resolve) => setTimeout(resolve, 0));
    });
  }
}

/** Waits real time inside act, for the app's own timers (e.g. a query's retry delay). */
export async function waitMs(ms: number) {
  await act(async () => {
    await new Promise((resolve) => setTimeout(resolve, ms));
  });
  await settle();
}

afterEach(async () => {
  for (const { root, container } of mounted.splice(0)) {
    await act(async () => root.unmount());
    container.remove();
  }
});
