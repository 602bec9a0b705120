import { pino, type Logger } from 'pino';

/** Structured JSON logs; quiet in tests unless LOG_LEVEL says otherwise. */
export function createLogger(level: string): Logger {
  return pino({
    level,
    redact: {
      paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'password'],
      remove: true,
    },
  });
}
export type { Logger };
