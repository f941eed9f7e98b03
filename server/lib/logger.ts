import pino from 'pino';

// The one logger. Level from LOG_LEVEL; tests default to warn to keep output readable.
export const logger = pino({
  level: process.env.LOG_LEVEL ?? (process.env.NODE_ENV === 'test' ? 'warn' : 'info'),
  base: { app: 'sigmaline', pid: process.pid },
  redact: ['req.headers.cookie', 'password', '*.password'],
});
export type Logger = typeof logger;
