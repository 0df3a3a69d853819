/**
 * Public API of the verification engine. Everything the server, the CLI and the client use from
 * shared/engine is re-exported here; modules import each other by relative path.
 */
export * from './types';
export * from './errors';
export * from './version';

export * from './fft';
export * from './windows';
export * from './detrend';
export * from './welch';
export * from './estimators';
export * from './random-errors';
export * from './f-distribution';
export * from './exact-frf-region';
export * from './recipe';
export * from './transient';
export * from './process';

export * from './random';
export * from './systems';
export * from './scenario';
export * from './synthesis/excitation-schema';
export { noiseSchema, type NoiseSpec } from './synthesis/noise';

export * from './scores/line-scores';
export * from './scores/modes';
export * from './scores/statistics';
export * from './scores/monte-carlo';
export * from './scores/mode-aggregate';
export * from './scores/criteria';
export * from './scores/resolution-bias';
export * from './scores/windowed-reference';
export * from './scores/expected-coherence';
export * from './scores/monte-carlo-error';
export * from './scores/monte-carlo-band';
export * from './scores/bootstrap';
export * from './scores/decision-figures';
export * from './scores/decision-rules';

export * from './study';
export * from './adaptive-stopping';
export * from './adaptive-study';
export * from './advice';
export * from './worker-run';

export * from './preflight/findings';
export * from './preflight/check';
export { MIN_EFFECTIVE_AVERAGES, blocksForEffectiveAverages } from './preflight/warnings';
export { stationaryBlocks } from './preflight/figures';
export * from './delay-bias';
export * from './sweep';
export * from './sweep-result';
