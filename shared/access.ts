// Who may do what in the shop, as data: each action names the roles allowed to do it. The server's
// route declarations, the client's navigation, its route guards and the buttons a page shows all
// read this one table, so a page never offers what the server would refuse, and a change of who
// may do something is one line here (the role matrix test in test/api then says what changed).
import type { Role } from './session-types';

export const may = {
  /** Users and their roles, the shop's settings, the audit trail, the demo mailbox, the hold sweep. */
  administer: ['owner'],
  /** Labour operations and their rates; exchange rates. */
  setRates: ['owner'],
  /** Merge two customer records into one; erase a customer. */
  mergeCustomers: ['owner'],
  /** Take back a cut after the cutter's own short window (with a reason). */
  undoAnyCut: ['owner'],
  /** Sales figures and the cylinders near their last step. */
  readSales: ['owner'],
  /** Stock figures: value and turnover, ABC classes, exposure. */
  readStockFigures: ['owner', 'buyer'],
  /** The counter: take a job in, change and note it, hand it back or cancel; customers. */
  runCounter: ['owner', 'machinist', 'staff'],
  /** The machine side: readings, step choice, bore sheet, the cut and its undo, holds. */
  machine: ['owner', 'machinist'],
  /** Move a job from one workshop state to the next. */
  moveJobs: ['owner', 'machinist'],
  /** Estimates (lines, discount, sending, approval), payments and refunds, invoices' credit notes. */
  takeMoney: ['owner', 'staff'],
  /** Engine families, step series, parts and their prices. */
  editCatalog: ['owner', 'buyer'],
  readSuppliers: ['owner', 'buyer', 'staff'],
  /** Suppliers' records and mapping their items to our parts. */
  editSuppliers: ['owner', 'buyer'],
  importPriceLists: ['owner', 'buyer', 'staff'],
  /** The stock and price-comparison CSV downloads. */
  exportStock: ['owner', 'buyer', 'staff'],
  /** Reorder alerts: read them and acknowledge them. */
  handleAlerts: ['owner', 'buyer'],
  /** Bins, receipts (with or without an order) and moves between bins. */
  receiveStock: ['owner', 'buyer', 'staff'],
  /** Correct a part's count up or down. */
  adjustStock: ['owner', 'buyer'],
  scrapUnits: ['owner', 'buyer', 'staff'],
  /** Measure a piston unit's skirt. */
  measureUnits: ['owner', 'buyer', 'staff', 'machinist'],
  /** Reorder rules and suggestions, sourcing, exchange rates read, purchase orders. */
  buy: ['owner', 'buyer'],
  /** Link a job that waits for parts to an order line, and unlink it. */
  keepOrderWaits: ['owner', 'buyer', 'machinist'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof may;

/** True when the role may do the action; no role (signed out, not yet loaded) may do nothing. */
export function allows(role: Role | null | undefined, action: Action): boolean {
  return !!role && (may[action] as readonly Role[]).includes(role);
}
