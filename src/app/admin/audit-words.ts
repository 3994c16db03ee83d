/** How recorded entities read in the audit trail; names not listed fall back to their own words. */
const ENTITY_WORDS: Record<string, string> = {
  part: 'Part',
  piston_unit: 'Piston',
  bin: 'Bin',
  step_series: 'Step series',
  engine_family: 'Engine family',
  hold: 'Hold',
  job: 'Job',
  user: 'User',
  settings: 'Shop settings',
  supplier: 'Supplier',
  supplier_item: 'Supplier item',
  price_list_import: 'Price list',
  purchase_order: 'Purchase order',
  order_line_wait: 'Job waiting on an order',
  reorder_default: 'Reorder default',
  exchange_rate: 'Exchange rate',
  alert: 'Stock alert',
};

/** How recorded actions read; unknown ones are spelled out from their name. */
const ACTION_WORDS: Record<string, string> = {
  'stock.receipt': 'Stock received',
  'stock.adjustment': 'Count corrected',
  'stock.move': 'Moved to another bin',
  'stock.scrap': 'Scrapped',
  'stock.measure': 'Piston measured',
  'part.create': 'Part added',
  'part.update': 'Part changed',
  'reorder_rule.update': 'Reorder rule set',
  'reorder_default.set': 'Reorder default set',
  'reorder_default.delete': 'Reorder default removed',
  'price_list.commit': 'Price list applied',
  'user.create': 'User added',
  'user.update': 'User changed',
  'user.password-reset': 'Password set by the owner',
  'user.password-change': 'Own password changed',
  'settings.update': 'Shop settings changed',
  'hold.create': 'Part held for a job',
  'hold.release': 'Hold released',
  'hold.move': 'Hold moved',
  'hold.expire': 'Hold expired',
  'job.collect': 'Job handed back',
  'job.cancel': 'Job called off',
  'bin.create': 'Bin added',
  'step_series.create': 'Step series added',
  'engine_family.create': 'Engine family added',
  'engine_family.update': 'Engine family changed',
  'supplier.create': 'Supplier added',
  'supplier.update': 'Supplier changed',
  'purchase_order.create': 'Purchase order drafted',
  'purchase_order.update': 'Purchase order changed',
  'purchase_order.send': 'Purchase order sent',
  'purchase_order.cancel': 'Purchase order cancelled',
  'purchase_order.receipt': 'Order delivery received',
  'order_wait.create': 'Job set to wait for an order',
  'order_wait.cancel': 'Wait for an order ended',
  'exchange_rate.set': 'Exchange rate set',
  'exchange_rate.delete': 'Exchange rate removed',
  'alert.acknowledge': 'Stock alert marked as seen',
};

function spelledOut(name: string): string {
  const words = name.replace(/[._-]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

export function entityWords(entity: string): string {
  return ENTITY_WORDS[entity] ?? spelledOut(entity);
}

export function actionWords(action: string): string {
  return ACTION_WORDS[action] ?? spelledOut(action);
}

export interface FieldChange {
  field: string;
  before: string | null;
  after: string | null;
}

function shown(value: unknown): string | null {
  if (value === undefined) return null;
  if (value === null) return '—';
  return typeof value === 'string' ? value : JSON.stringify(value);
}

/**
 * The fields a change touched: for an update the ones whose value differs, for a creation (no
 * before) or a removal (no after) every field there is.
 */
export function fieldChanges(before: unknown, after: unknown): FieldChange[] {
  const b = before && typeof before === 'object' ? (before as Record<string, unknown>) : {};
  const a = after && typeof after === 'object' ? (after as Record<string, unknown>) : {};
  const fields = [...new Set([...Object.keys(b), ...Object.keys(a)])];
  return fields
    .filter((f) => JSON.stringify(b[f]) !== JSON.stringify(a[f]))
    .map((f) => ({ field: f, before: shown(b[f]), after: shown(a[f]) }));
}
