import { pino, type Logger } from 'pino';

export type { Logger };

/** One JSON line per event on stdout; `LOG_LEVEL=silent` in tests. */
export function createLogger(level = process.env['LOG_LEVEL'] ?? 'info'): Logger {
  return pino({ name: 'rimelog', level });
}
