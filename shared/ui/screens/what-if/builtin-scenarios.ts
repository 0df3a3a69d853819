/**
 * Built-in scenarios the bench opens with, taken from scenarios/ at build time (the same files the
 * CLI and the demo lab use), and the bench's starting settings for a scenario.
 */
import armChannelDelay from '@/scenarios/arm-channel-delay.json';
import frameOutputNoise from '@/scenarios/frame-output-noise.json';
import { parseScenario, type Scenario } from '@/shared/engine/scenario';
import { buildSystem } from '@/shared/engine/systems';
import type { WhatIfSettings } from './what-if-run';

export const BUILTIN_SCENARIOS: readonly { id: string; label: string; definition: unknown }[] = [
  { id: 'builtin:frame-output-noise', label: 'Fan frame, three close modes', definition: frameOutputNoise },
  { id: 'builtin:arm-channel-delay', label: 'Drone arm, channel delay', definition: armChannelDelay },
];

/** Longest record the bench simulates by default (samples), to keep an update near a second. */
export const BENCH_DEFAULT_SAMPLES = 2 ** 16;
export const BENCH_MAX_SAMPLES = 2 ** 18;

const pow2 = (x: number) => 2 ** Math.round(Math.log2(x));

/**
 * Starting settings: the scenario's own noise and delay; a block resolving a quarter of the
 * narrowest half-power bandwidth (common practice), within 256 … an eighth of the record; Hann.
 */
export function startingSettings(definition: unknown): WhatIfSettings {
  const s: Scenario = parseScenario(definition);
  const fs = s.acquisition.sampleRateHz;
  const samples = Math.min(Math.round(s.acquisition.durationS * fs), BENCH_DEFAULT_SAMPLES);
  const modes = buildSystem(s.system).modes;
  const narrowest = Math.min(...modes.map((m) => m.halfPowerBandwidthHz));
  const block = Math.max(256, Math.min(pow2(samples / 8), 2 ** Math.ceil(Math.log2(fs / (narrowest / 4)))));
  const noise = s.errors.inputNoise && s.errors.outputNoise ? 'both' : s.errors.inputNoise ? 'input' : s.errors.outputNoise ? 'output' : 'none';
  const given = s.errors.outputNoise ?? s.errors.inputNoise;
  return {
    noise,
    snrDb: given && 'snrDb' in given ? given.snrDb : 20,
    delayMs: (s.errors.delayS ?? 0) * 1000,
    blockLength: block,
    window: 'hann',
    estimator: 'H1',
    durationS: samples / fs,
    seed: 1,
    toleranceDb: 1,
  };
}
