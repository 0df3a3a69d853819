/** Structured JSON logs (pino). Secrets never go into log fields: see the redact list. */
import pino from 'pino';

export type Logger = pino.Logger;

export function createLogger(level: string): Logger {
  return pino({
    level,
    base: { service: 'plumbline' },
    redact: { paths: ['password', '*.password', 'req.headers.cookie', 'req.headers.authorization'], censor: '[redacted]' },
  });
}
