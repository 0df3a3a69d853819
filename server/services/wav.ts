/**
 * Two-channel 32-bit IEEE-float WAV (RIFF/WAVE, format tag 3) of a scenario's signals, for labs
 * that feed Plumbline's samples to their own acquisition software.
 *
 * Scaling: each channel is divided by its own full-scale value (its largest absolute sample, so
 * the stored samples lie in [-1, 1]); the physical value is `sample × scale`. The scales and units
 * are written into the file's LIST/INFO comment (ICMT) and returned to the caller, so a reader
 * never has to guess them. WAV holds an integer sample rate only: other rates are refused.
 */
import { AppError } from '../errors';

export interface WavChannel {
  name: string;
  unit: string;
  samples: Float64Array;
}

export interface WavFile {
  bytes: Buffer;
  /** Physical units per stored unit, one per channel, in channel order. */
  scales: number[];
  comment: string;
}

function fullScale(x: Float64Array): number {
  let peak = 0;
  for (let i = 0; i < x.length; i++) peak = Math.max(peak, Math.abs(x[i]));
  return peak > 0 ? peak : 1;
}

function infoChunk(comment: string): Buffer {
  const text = Buffer.from(comment + '\0', 'utf8');
  const padded = text.length % 2 ? Buffer.concat([text, Buffer.from([0])]) : text;
  const body = Buffer.alloc(4 + 8 + padded.length);
  body.write('INFO', 0, 'ascii');
  body.write('ICMT', 4, 'ascii');
  body.writeUInt32LE(text.length, 8);
  padded.copy(body, 12);
  const head = Buffer.alloc(8);
  head.write('LIST', 0, 'ascii');
  head.writeUInt32LE(body.length, 4);
  return Buffer.concat([head, body]);
}

export function encodeFloatWav(sampleRateHz: number, channels: WavChannel[]): WavFile {
  if (!Number.isInteger(sampleRateHz) || sampleRateHz < 1 || sampleRateHz > 2 ** 31 - 1) {
    const message = `sampleRateHz=${sampleRateHz}: a WAV file holds a whole number of samples per second; use the CSV export`;
    throw new AppError(400, 'invalid_request', message, { fields: [{ path: 'sampleRateHz', message }] });
  }
  const frames = channels[0]?.samples.length ?? 0;
  if (channels.some((c) => c.samples.length !== frames)) throw new Error('WAV channels differ in length');
  const scales = channels.map((c) => fullScale(c.samples));
  const comment =
    `Plumbline signals, ${sampleRateHz} Hz. ` +
    channels.map((c, i) => `channel ${i + 1} = ${c.name} in ${c.unit} = sample x ${scales[i].toPrecision(17)}`).join('; ');
  const n = channels.length;
  const data = Buffer.alloc(frames * n * 4);
  for (let f = 0; f < frames; f++) {
    for (let c = 0; c < n; c++) data.writeFloatLE(channels[c].samples[f] / scales[c], (f * n + c) * 4);
  }
  const fmt = Buffer.alloc(8 + 16);
  fmt.write('fmt ', 0, 'ascii');
  fmt.writeUInt32LE(16, 4);
  fmt.writeUInt16LE(3, 8); // WAVE_FORMAT_IEEE_FLOAT
  fmt.writeUInt16LE(n, 10);
  fmt.writeUInt32LE(sampleRateHz, 12);
  fmt.writeUInt32LE(sampleRateHz * n * 4, 16);
  fmt.writeUInt16LE(n * 4, 20);
  fmt.writeUInt16LE(32, 22);
  const info = infoChunk(comment);
  const dataHead = Buffer.alloc(8);
  dataHead.write('data', 0, 'ascii');
  dataHead.writeUInt32LE(data.length, 4);
  const riff = Buffer.alloc(12);
  riff.write('RIFF', 0, 'ascii');
  riff.writeUInt32LE(4 + fmt.length + info.length + dataHead.length + data.length, 4);
  riff.write('WAVE', 8, 'ascii');
  return { bytes: Buffer.concat([riff, fmt, info, dataHead, data]), scales, comment };
}
