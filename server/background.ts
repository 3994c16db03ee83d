// Work the server does besides answering requests (the outbox worker, the daily hold sweep). Each
// feature that needs it adds a starter here. Everything coordinates through PostgreSQL, so several
// server processes may run these side by side.
import { startMailBackground } from './mail/mail-background';
import { startDigestSweep } from './alerts/digest-sweep';
import { startHoldSweep } from './jobs/hold-sweep';
import { startRateLimitSweep } from './http/rate-limit-sweep';
import { startPreviewSweep } from './imports/preview-sweep';
import { startPaymentsBackground } from './payments/payments-background';
import type { Background } from './background-work';

type Starter = () => Promise<Background> | Background;

const starters: Starter[] = [
  startMailBackground,
  startDigestSweep,
  startHoldSweep,
  startRateLimitSweep,
  startPreviewSweep,
  startPaymentsBackground,
];

export async function startBackgroundWork(): Promise<Background> {
  if (process.env.STEPSTOCK_NO_BACKGROUND === '1') return { stop: async () => undefined };
  const running = await Promise.all(starters.map((s) => s()));
  return {
    stop: async () => {
      await Promise.all(running.map((r) => r.stop()));
    },
  };
}
