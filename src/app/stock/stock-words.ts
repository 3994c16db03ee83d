import type { UnitStatus } from '../../../shared/api/catalog';
import type { LedgerKind } from '../../../shared/api/stock';

/** How a piston's status reads on screen, with an icon so it never rests on colour. */
export const STATUS_LABELS: Record<UnitStatus, { text: string; icon: string }> = {
  free: { text: 'Free', icon: 'check_circle' },
  held: { text: 'Held for a job', icon: 'lock' },
  issued: { text: 'Issued', icon: 'outbox' },
  returned: { text: 'Back to supplier', icon: 'undo' },
  scrapped: { text: 'Scrapped', icon: 'delete' },
};

/** How a stock movement reads in the ledger. */
export const KIND_WORDS: Record<LedgerKind, string> = {
  receipt: 'Received',
  adjustment: 'Count corrected',
  reservation: 'Held for a job',
  release: 'Hold released',
  issue: 'Issued',
  return: 'Returned',
  scrap: 'Scrapped',
  transfer: 'Moved',
  measure: 'Measured',
};
