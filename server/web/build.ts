/**
 * Builds the web export (expo export --platform web) when it is missing or older than any source
 * file of the client. Used by `npm start` and by the browser tests.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const SOURCES = ['app', 'shared/ui', 'shared/api', 'shared/engine', 'assets', 'app.json', 'package-lock.json'];

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

export function webExportIsStale(root: string, outDir: string): boolean {
  const index = path.join(outDir, 'index.html');
  if (!fs.existsSync(index)) return true;
  const built = fs.statSync(index).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(root, s)) > built);
}

/** Runs the export if stale; returns whether it built. Throws if the build fails. */
export function ensureWebExport(root: string, outDir: string, log: (msg: string) => void = () => {}): boolean {
  if (!webExportIsStale(root, outDir)) return false;
  log(`Building the web app into ${path.relative(root, outDir)} (about half a minute the first time)…`);
  const bin = path.join(root, 'node_modules', '.bin', 'expo');
  const result = spawnSync(bin, ['export', '--platform', 'web', '--output-dir', outDir], {
    cwd: root,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1' },
  });
  if (result.status !== 0) throw new Error(`The web export failed (expo export exited with ${result.status}).`);
  fs.utimesSync(path.join(outDir, 'index.html'), new Date(), new Date());
  return true;
}
