import pino from 'pino';

/** One JSON logger for the process. Never log personal data: ids and counts only. */
export const logger = pino({
  level: process.env.LOG_LEVEL ?? (process.env.NODE_ENV === 'test' ? 'warn' : 'info'),
  base: { service: 'coppice' },
  redact: {
    paths: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]'],
    remove: true,
  },
});
