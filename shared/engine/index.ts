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

export * from './study';
export * from './advice';
export * from './worker-run';
export * from './sweep';
export * from './sweep-result';
