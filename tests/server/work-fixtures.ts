/**
 * Small definitions for the work-side server tests: an SDOF scenario and a recipe sized so that
 * one run takes milliseconds. The SDOF figures (fn = 50 Hz, ζ = 2 %, k = 1e4 N/m) are the
 * textbook single-degree-of-freedom receptance 1/(k − mω² + jcω) (e.g. S. S. Rao, Mechanical
 * Vibrations); the tests use them only as known-answer inputs.
 */
import type { ScenarioInput } from '@/shared/engine/scenario';

export const sdofSystem = { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: 1e4, naturalFrequencyHz: 50, dampingRatio: 0.02 } as const;

export function smallScenario(name = 'SDOF 50 Hz, output noise', snrDb = 30): ScenarioInput {
  return {
    name,
    system: sdofSystem,
    acquisition: { sampleRateHz: 512, durationS: 8 },
    excitation: { kind: 'random', band: { lowHz: 0, highHz: 200 }, level: { rmsN: 1 } },
    errors: { outputNoise: { snrDb } },
  };
}

export function smallRecipe(name = 'Hann 256, H1') {
  return {
    name,
    blockLength: 256,
    window: 'hann',
    overlap: 0.5,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 10, highHz: 150 },
    scaling: 'density',
    tolerances: { magnitudeDb: 3, phaseDeg: 20, minCoherence: 0.5 },
  };
}

/**
 * A pseudo-random (periodic) excitation whose period is the recipe's block, analysed with a
 * rectangular window and no overlap: every block holds whole periods, so there is no leakage and
 * H1 equals the exact FRF at every line (the DFT of a periodic sequence over whole periods; e.g.
 * A. V. Oppenheim & R. W. Schafer, Discrete-Time Signal Processing, on the DFS/DFT relation).
 * No noise, so the coherence is 1.
 */
export function periodicScenario(name = 'SDOF 50 Hz, pseudo-random, no errors'): ScenarioInput {
  return {
    name,
    system: sdofSystem,
    acquisition: { sampleRateHz: 512, durationS: 8 },
    excitation: { kind: 'pseudo-random', band: { lowHz: 0, highHz: 200 }, periodS: 0.5, level: { rmsN: 1 } },
  };
}

export function periodicRecipe(name = 'Rectangular 256, whole periods, H1') {
  return {
    name,
    blockLength: 256,
    window: 'rectangular',
    overlap: 0,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 10, highHz: 150 },
    scaling: 'density',
    tolerances: { magnitudeDb: 0.01, phaseDeg: 0.1 },
  };
}

type Getter = { get(url: string): PromiseLike<{ body: { status: string } }> };

/** Polls GET study until it has ended; returns the study. */
export async function waitForStudy(agent: Getter, url: string, timeoutMs = 60_000): Promise<{ status: string; [k: string]: unknown }> {
  const start = Date.now();
  for (;;) {
    const { body } = await agent.get(url);
    if (!['queued', 'running'].includes(body.status)) return body;
    if (Date.now() - start > timeoutMs) throw new Error(`study at ${url} still ${body.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** A session cookie for fetch (which reads a server-sent event stream as it comes). */
export async function sessionCookie(baseUrl: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status}`);
  return (res.headers.get('set-cookie') ?? '').split(';')[0];
}

/** Parses `event: x` / `data: {...}` blocks of a server-sent event stream. */
export function parseEvents(text: string): { event: string; data: Record<string, unknown> }[] {
  return text
    .split('\n\n')
    .map((block) => block.split('\n').filter((l) => l && !l.startsWith(':')))
    .filter((lines) => lines.length > 0)
    .map((lines) => ({
      event: lines.find((l) => l.startsWith('event: '))?.slice(7) ?? 'message',
      data: JSON.parse(lines.find((l) => l.startsWith('data: '))?.slice(6) ?? '{}'),
    }));
}
