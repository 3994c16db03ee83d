import pino from 'pino';
import { config } from './config';

export const logger = pino({
  level: config.NODE_ENV === 'test' ? (process.env.LOG_LEVEL ?? 'silent') : config.LOG_LEVEL,
  // Session and XSRF tokens never reach the log, neither coming in nor going out; nor do the payment
  // service's key and signatures.
  redact: [
    'req.headers.cookie',
    'req.headers["x-xsrf-token"]',
    'req.headers.authorization',
    'req.headers["stripe-signature"]',
    'secretKey',
    'webhookSecret',
    '*.secretKey',
    '*.webhookSecret',
    'res.headers["set-cookie"]',
    'password',
  ],
});
