/**
 * `npm start`: check the config, build the web app if it is missing or stale, then start the
 * server with its embedded defaults and print how to sign in. SIGINT/SIGTERM shut down cleanly.
 */
import path from 'node:path';
import { ConfigError, loadConfig } from './config';
import { DEMO_USERS } from './seed/demo-lab';
import { startServer } from './start';
import { ensureWebExport } from './web/build';

async function main() {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(2);
    }
    throw err;
  }
  const root = path.resolve(__dirname, '..');
  if (process.argv.includes('--build-web')) ensureWebExport(root, config.webDir, (m) => console.log(m));

  const running = await startServer(config);
  const demo = config.demo.seed
    ? `\n  Demo sign-in: ${DEMO_USERS.map((u) => u.email).join(', ')}\n  Demo password: ${config.demo.password}`
    : '';
  const mail = running.fakeSmtp
    ? `\n  Mail goes to the local fake SMTP server on port ${running.fakeSmtp.port}; each message is also written to ${path.join(config.dataDir, 'fake-mail')}.`
    : `\n  Mail goes to ${config.mail.smtp?.host}:${config.mail.smtp?.port}.`;
  console.log(`\nPlumbline is running at ${running.url}\n  Database: ${config.databaseFile}${demo}${mail}\n`);

  const stop = (signal: string) => {
    running.logger.info({ signal }, 'shutting down');
    running.close().then(
      () => process.exit(0),
      (err) => {
        running.logger.error({ err }, 'shutdown failed');
        process.exit(1);
      },
    );
  };
  process.once('SIGINT', () => stop('SIGINT'));
  process.once('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err) => {
  console.error('Plumbline could not start:', err instanceof Error ? err.message : err);
  process.exit(1);
});
