/**
 * Renders into jsdom with react-dom, so tests see the DOM that react-native-web gives a browser
 * (roles, aria-* and <input>s). @testing-library/react-native queries host components named
 * Text/View and finds nothing in react-native-web's <div>s, so the web project uses
 * @testing-library/dom on the real DOM instead.
 *
 * Tests never sleep: after an action they wait for what they expect to see (`findBy*`,
 * `waitFor`), with the generous timeout set in ./setup.ts. `cleanup()` runs after every test.
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

/** Unmounts everything a test rendered and empties the document, even after a failure. */
export async function cleanup() {
  for (const { root, container } of mounted.splice(0)) {
    try {
      await act(async () => root.unmount());
    } finally {
      container.remove();
    }
  }
  document.body.innerHTML = '';
}
