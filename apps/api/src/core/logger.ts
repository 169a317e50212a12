import pino from 'pino';
import { config } from '../config';

/** The one logger. Credentials and cookies never reach the log. */
export const logger = pino({
  level: config.logLevel,
  base: { service: 'ohmprint-api' },
  redact: {
    paths: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]', '*.password', '*.token'],
    censor: '[redacted]',
  },
});
