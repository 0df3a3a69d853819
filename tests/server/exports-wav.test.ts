/**
 * The WAV export of a scenario's signals: a RIFF/WAVE file with format tag 3 (IEEE float), two
 * channels, 32 bits, the scenario's sample rate, and samples equal to the engine's values divided
 * by the stated scale, to float32 precision (Microsoft/IBM RIFF WAVE specification, 1991; IEEE 754
 * single precision has a relative spacing of 2^-23 ≈ 1.2e-7).
 */
import { encodeFloatWav } from '@/server/services/wav';
import { simulateScenario } from '@/shared/engine/scenario';
import { startTestServer, type TestServer } from './helpers';
import { smallScenario } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
let scenarioId: string;

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  scenarioId = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('WAV scenario') }).expect(201)).body.id;
}, 30_000);
afterAll(() => t.close());

function readWav(buf: Buffer) {
  expect(buf.toString('ascii', 0, 4)).toBe('RIFF');
  expect(buf.readUInt32LE(4)).toBe(buf.length - 8);
  expect(buf.toString('ascii', 8, 12)).toBe('WAVE');
  const chunks: Record<string, Buffer> = {};
  for (let at = 12; at < buf.length; ) {
    const id = buf.toString('ascii', at, at + 4);
    const size = buf.readUInt32LE(at + 4);
    chunks[id] = buf.subarray(at + 8, at + 8 + size);
    at += 8 + size + (size % 2);
  }
  const fmt = chunks['fmt '];
  return {
    format: fmt.readUInt16LE(0),
    channels: fmt.readUInt16LE(2),
    rate: fmt.readUInt32LE(4),
    byteRate: fmt.readUInt32LE(8),
    blockAlign: fmt.readUInt16LE(12),
    bits: fmt.readUInt16LE(14),
    comment: chunks.LIST ? chunks.LIST.toString('utf8', 12).replace(/\0+$/, '') : '',
    data: chunks.data,
  };
}

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const parts: Buffer[] = [];
  stream.on('data', (c: Buffer) => parts.push(c));
  stream.on('end', () => cb(null, Buffer.concat(parts)));
};

it('writes the engine samples as two float32 channels with the scaling stated', async () => {
  const res = await analyst.get(`${lab}/scenarios/${scenarioId}/signals.wav?seed=7`).buffer(true).parse(binary).expect(200);
  expect(res.headers['content-type']).toBe('audio/wav');
  const wav = readWav(res.body as Buffer);
  const record = simulateScenario(smallScenario('WAV scenario'), 7);
  expect(wav).toMatchObject({ format: 3, channels: 2, bits: 32, blockAlign: 8, rate: record.sampleRateHz, byteRate: record.sampleRateHz * 8 });
  expect(wav.data.length).toBe(record.input.length * 8);

  const scales = String(res.headers['x-channel-scales']).split(',').map(Number);
  expect(wav.comment).toContain(`channel 1 = input (force) in N = sample x ${scales[0].toPrecision(17)}`);
  expect(wav.comment).toContain('channel 2 = output (response) in m');
  let worst = 0;
  let peak = 0;
  for (let i = 0; i < record.input.length; i++) {
    const x = wav.data.readFloatLE(i * 8) * scales[0];
    const y = wav.data.readFloatLE(i * 8 + 4) * scales[1];
    worst = Math.max(worst, Math.abs(x - record.input[i]) / scales[0], Math.abs(y - record.output[i]) / scales[1]);
    peak = Math.max(peak, Math.abs(wav.data.readFloatLE(i * 8)), Math.abs(wav.data.readFloatLE(i * 8 + 4)));
  }
  expect(worst).toBeLessThan(2 ** -23);
  expect(peak).toBe(1); // each channel is scaled by its own largest sample
});

it('refuses a sample rate that a WAV file cannot hold', () => {
  expect(() => encodeFloatWav(1000.5, [{ name: 'x', unit: 'N', samples: new Float64Array(4) }])).toThrow(/sampleRateHz=1000.5/);
});

it('keeps the file to its lab', async () => {
  const other = await t.signIn('auditor');
  await other.get(`${lab}/scenarios/${scenarioId}/signals.wav`).expect(200);
  await analyst.get(`/api/v1/labs/no-such-lab/scenarios/${scenarioId}/signals.wav`).expect(404);
});
