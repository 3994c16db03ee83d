// Where a purchase order stands, in our own words: read by the purchasing contract and by the
// stock one (a delivery received against an order says how that order stands now).

/** Our own names for where an order stands. */
export const ORDER_STATES = ['drafting', 'sent_out', 'partly_in', 'all_in', 'called_off'] as const;
export type OrderState = (typeof ORDER_STATES)[number];
export const ORDER_STATE_LABELS: Record<OrderState, string> = {
  drafting: 'Drafting',
  sent_out: 'Sent out',
  partly_in: 'Partly in',
  all_in: 'All in',
  called_off: 'Called off',
};
export const OPEN_ORDER_STATES: OrderState[] = ['sent_out', 'partly_in'];
