/**
 * The pre-flight check on the command line, run as a child process: a recipe that cannot run on a
 * scenario stops verify and advise with status 2 and every refusal in plain words on stderr, with
 * nothing on stdout and no file written; a warned pair runs with its warnings on stderr.
 * Figure: the frame scenarios sample at 512 Hz, so their Nyquist frequency is 256 Hz (fs/2).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

jest.setTimeout(60_000); // child processes on a shared two-core machine

const ROOT = resolve(__dirname, '..', '..');
const BIN = join(ROOT, 'server', 'cli', 'plumbline.js');
let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-cli-preflight-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function plumbline(...args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [BIN, ...args], { cwd: ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.on('error', fail);
    child.on('close', (status) => done({ status, stdout, stderr }));
  });
}

describe('plumbline and the pre-flight check', () => {
  it('verify refuses the arm recipe (band 200–1200 Hz) on a 512 Hz frame scenario: status 2, nothing run', async () => {
    const output = join(dir, 'refused.txt');
    const r = await plumbline('verify', '--recipe', 'arm-burst-random-rectangular', '--scenario', 'frame-close-modes', '--seeds', '1', '--output', output);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('cannot run');
    expect(r.stderr).toContain("The recipe's band reaches 1200 Hz, above the scenario's Nyquist frequency of 256 Hz.");
    expect(r.stderr).toContain('lies wholly outside the band the scenario excites');
    expect(existsSync(output)).toBe(false);
  });

  it('verify runs a warned pair and prints its warnings on stderr', async () => {
    const r = await plumbline('verify', '--recipe', 'frame-survey-hann-50', '--scenario', 'arm-short-record', '--seeds', '1');
    expect([0, 1]).toContain(r.status);
    expect(r.stdout).toMatch(/(PASS|FAIL)\s+/);
    expect(r.stderr).toMatch(/^warning: ".+": The system's mode at \d+ Hz lies outside the recipe's band, 20–120 Hz/m);
  });

  it('advise with a band above Nyquist refuses its own draft: status 2, no recipe file', async () => {
    const recipeOut = join(dir, 'draft.json');
    const r = await plumbline('advise', '--scenario', 'frame-output-noise', '--target-db', '1', '--band', '30,900', '--recipe-out', recipeOut);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("The recipe's band reaches 900 Hz, above the scenario's Nyquist frequency of 256 Hz.");
    expect(existsSync(recipeOut)).toBe(false);
  });
});
