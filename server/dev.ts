/**
 * `npm run dev`: the API on PORT+1 (default 8081) and the Expo dev server for the web target on
 * PORT (default 8080), with /api forwarded by metro.config.js. Ctrl-C stops both.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { loadConfig } from './config';
import { startServer } from './start';

async function main() {
  const webPort = Number(process.env.PORT ?? 8080);
  const apiPort = webPort + 1;
  const config = loadConfig({ ...process.env, PORT: String(apiPort), PUBLIC_URL: process.env.PUBLIC_URL ?? `http://localhost:${webPort}` });
  const api = await startServer(config);
  console.log(`API on ${api.url}; the app will be on http://localhost:${webPort}`);
  const root = path.resolve(__dirname, '..');
  const expo = spawn(path.join(root, 'node_modules/.bin/expo'), ['start', '--web', '--port', String(webPort)], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, PLUMBLINE_API_PORT: String(apiPort), BROWSER: 'none' },
  });
  const stop = () => {
    expo.kill('SIGTERM');
    api.close().then(() => process.exit(0));
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  expo.on('exit', (code) => api.close().then(() => process.exit(code ?? 0)));
}

main().catch((err) => {
  console.error('Could not start the development servers:', err instanceof Error ? err.message : err);
  process.exit(1);
});
