/** Structured JSON logs (pino). Secrets never go into log fields: see the redact list. */
import pino from 'pino';

export type Logger = pino.Logger;

/** The server's logger; `destination` (default stdout) lets tests read what would be written. */
export function createLogger(level: string, destination?: pino.DestinationStream): Logger {
  const options = {
    level,
    base: { service: 'plumbline' },
    redact: { paths: ['password', '*.password', 'req.headers.cookie', 'req.headers.authorization'], censor: '[redacted]' },
  };
  return destination ? pino(options, destination) : pino(options);
}
