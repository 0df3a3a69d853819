/**
 * Set-up of the UI project (jest.config.js, setupFilesAfterEnv), run before every test file.
 *
 * - Time limit: 120 s a test (`uiTestTimeoutMs` in jest.config.js): the heaviest test (the what-if
 *   bench, two 65536-sample simulations) takes 4 s on a quiet machine and over 60 s at a load
 *   average of 16 on two cores.
 * - Waiting: `findBy*` and `waitFor` give up after 45 s (the machine is shared and may be busy;
 *   a wait ends as soon as its condition holds, so a generous limit costs nothing when all is
 *   well). While they wait, React renders on its own schedule, as @testing-library/react arranges
 *   it; events fired by @testing-library/dom are wrapped in act().
 * - Isolation: after every test, whatever passed or failed, the rendered roots are unmounted, the
 *   app's query clients are cleared (no retry or poll of one test reaches the next one's fake
 *   API), and localStorage and fetch are reset.
 */
import { configure } from '@testing-library/dom';
import type { QueryClient } from '@tanstack/react-query';
import { act } from 'react';
import { cleanup } from './dom';

declare const uiTestTimeoutMs: number; // jest.config.js, the ui project's globals
jest.setTimeout(uiTestTimeoutMs);

const actEnvironment = globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean };

configure({
  asyncUtilTimeout: 45_000,
  asyncWrapper: async (wait) => {
    const previous = actEnvironment.IS_REACT_ACT_ENVIRONMENT;
    actEnvironment.IS_REACT_ACT_ENVIRONMENT = false;
    try {
      const result = await wait();
      // Let the updates that ended the wait finish before act() is expected again.
      await new Promise((resolve) => setTimeout(resolve, 0));
      return result;
    } finally {
      actEnvironment.IS_REACT_ACT_ENVIRONMENT = previous;
    }
  },
  eventWrapper: (fire) => {
    let result: unknown;
    act(() => {
      result = fire();
    });
    return result;
  },
});

// Every query client the app creates (app/_layout.tsx), so that cleanup can clear it.
const mockQueryClients: QueryClient[] = [];
jest.mock('@/shared/ui/api/query-client', () => {
  const actual = jest.requireActual('@/shared/ui/api/query-client');
  return {
    ...actual,
    createQueryClient: () => {
      const client = actual.createQueryClient();
      mockQueryClients.push(client);
      return client;
    },
  };
});

const noFakeApi = (async (input: RequestInfo | URL) => {
  throw new Error(`fetch(${String(input)}) with no fake API installed: a test's request outlived it`);
}) as typeof fetch;

afterEach(async () => {
  await cleanup();
  for (const client of mockQueryClients.splice(0)) client.clear();
  localStorage.clear();
  globalThis.fetch = noFakeApi;
});
