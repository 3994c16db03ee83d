// Each server process without real payment keys starts the local payment stand-in on a free
// loopback port (like the local mailbox), so asking for a deposit works in the demo and the tests;
// the stand-in sends its events back to this process once it listens (main.ts says where).
import type { Background } from '../background-work';
import { logger } from '../logger';
import { startFakePayments } from './fake-payments';
import { localPayments, realPaymentsConfigured, useLocalPayments } from './payment-client';

export async function startPaymentsBackground(): Promise<Background> {
  if (realPaymentsConfigured() || localPayments()) return { stop: async () => undefined };
  const fake = await startFakePayments();
  useLocalPayments(fake);
  logger.warn(
    { url: fake.url },
    'PAYMENTS_SECRET_KEY is not set: online payments go to the local test payment service',
  );
  return {
    stop: async () => {
      useLocalPayments(null);
      await fake.stop();
    },
  };
}
