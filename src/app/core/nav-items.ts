import { ROLES, type Role } from '../../../shared/session-types';
import { may } from '../../../shared/access';

/** The named sections of the side navigation, in display order. */
export const NAV_GROUPS = [
  { id: 'today', label: 'Daily work' },
  { id: 'stock', label: 'Shelf and stock' },
  { id: 'buying', label: 'Buying' },
  { id: 'figures', label: 'Figures' },
  { id: 'shop', label: 'Shop and account' },
] as const;
export type NavGroupId = (typeof NAV_GROUPS)[number]['id'];

/** One entry of the side navigation. */
export interface NavItem {
  /** Absolute router path, e.g. '/admin/users'. */
  path: string;
  /** The section it is listed under. */
  group: NavGroupId;
  label: string;
  /** A Material Symbols Outlined ligature name, e.g. 'group'. */
  icon: string;
  /** Who sees the entry: the `may` action (shared/access.ts) of the route it opens. */
  roles: readonly Role[];
  /** One line on what a person does there (the link's description). */
  hint?: string;
}

/**
 * Everything the side navigation can show, in display order within each group. Each feature
 * appends its own entries here; the shell shows each person only the entries of their role.
 */
export const NAV_ITEMS: NavItem[] = [
  { path: '/', group: 'today', label: 'Home', icon: 'home', roles: ROLES },
  {
    path: '/admin/users',
    group: 'shop',
    label: 'Users',
    icon: 'group',
    roles: may.administer,
    hint: 'Add people, set what each may do, reset a forgotten password.',
  },
  {
    path: '/admin/settings',
    group: 'shop',
    label: 'Shop settings',
    icon: 'tune',
    roles: may.administer,
    hint: 'Name and hours, hold expiry, cut per pass, and the costs behind reorder points.',
  },
  {
    path: '/money/labour',
    group: 'shop',
    label: 'Labour prices',
    icon: 'request_quote',
    roles: may.setRates,
    hint: 'What boring, honing and the other work cost, and which go on new estimates.',
  },
  {
    path: '/admin/audit',
    group: 'shop',
    label: 'Audit trail',
    icon: 'manage_history',
    roles: may.administer,
    hint: 'Who changed stock, prices, reorder rules and users, and what it was before.',
  },
  {
    path: '/catalog/families',
    group: 'stock',
    label: 'Engine families',
    icon: 'stairs',
    roles: ROLES,
    hint: "Each family's step ladder: every oversize with its measured pistons.",
  },
  {
    path: '/catalog/parts',
    group: 'stock',
    label: 'Parts',
    icon: 'inventory_2',
    roles: ROLES,
    hint: 'Pistons, ring sets, kits and small parts; scan a box to find it.',
  },
  {
    path: '/stock/receive',
    group: 'stock',
    label: 'Receive',
    icon: 'move_to_inbox',
    roles: may.receiveStock,
    hint: 'Take a delivery in against its order, measure each piston, print its labels.',
  },
  {
    path: '/stock/units',
    group: 'stock',
    label: 'Pistons on the shelf',
    icon: 'straighten',
    roles: ROLES,
    hint: 'Every piston with its measured size, bin and status.',
  },
  {
    path: '/stock/exposure',
    group: 'stock',
    label: 'Empty steps',
    icon: 'report',
    roles: ROLES,
    hint: 'Steps with no free piston, the most asked-for first.',
  },
  {
    path: '/stock/bins',
    group: 'stock',
    label: 'Bins',
    icon: 'shelves',
    roles: may.receiveStock,
    hint: 'Where things sit; print bin labels.',
  },
  {
    path: '/stock/ledger',
    group: 'stock',
    label: 'Stock movements',
    icon: 'receipt_long',
    roles: ROLES,
    hint: 'Every receipt, count, move and write-off, with who and why.',
  },
  {
    path: '/jobs',
    group: 'today',
    label: 'Job bench',
    icon: 'view_kanban',
    roles: ROLES,
    hint: 'Every open job by stage, due date first, and which are waiting for parts.',
  },
  {
    path: '/jobs/new',
    group: 'today',
    label: 'Take in a job',
    icon: 'add_box',
    roles: may.runCounter,
    hint: 'Book a cylinder in: customer, engine, cylinders, what they want and by when.',
  },
  {
    path: '/customers',
    group: 'today',
    label: 'Customers',
    icon: 'contacts',
    roles: ROLES,
    hint: 'Who brought what: contact details, their jobs, and every bore of each cylinder.',
  },
  {
    path: '/insights/sales',
    group: 'figures',
    label: 'What sells',
    icon: 'trending_up',
    roles: may.readSales,
    hint: 'Units, revenue and margin by family and step, month by month.',
  },
  {
    path: '/insights/money',
    group: 'figures',
    label: 'Invoiced and owed',
    icon: 'payments',
    roles: may.readSales,
    hint: 'Labour and parts invoiced by month, estimates approved, balances owed, deposits held.',
  },
  {
    path: '/insights/stock',
    group: 'figures',
    label: 'What sits',
    icon: 'inventory',
    roles: may.readStockFigures,
    hint: 'Money on the shelf, turnover, and parts that have not moved.',
  },
  {
    path: '/insights/abc',
    group: 'figures',
    label: 'ABC classes',
    icon: 'leaderboard',
    roles: may.readStockFigures,
    hint: 'The few parts that carry most of the value, and the long tail.',
  },
  {
    path: '/insights/exposure',
    group: 'figures',
    label: 'Ran short',
    icon: 'hourglass_top',
    roles: may.readStockFigures,
    hint: 'Steps asked for with nothing free, jobs that waited, suppliers that were late.',
  },
  {
    path: '/insights/cylinders',
    group: 'figures',
    label: 'Near their last step',
    icon: 'vertical_align_top',
    roles: may.readSales,
    hint: 'Cylinders with one step or none left: customers to tell, sleeves to expect.',
  },
  {
    path: '/suppliers',
    group: 'buying',
    label: 'Suppliers',
    icon: 'local_shipping',
    roles: may.readSuppliers,
    hint: 'Who sells what, at which price; every price a list has ever given.',
  },
  {
    path: '/imports/new',
    group: 'buying',
    label: 'Bring in a price list',
    icon: 'upload_file',
    roles: may.importPriceLists,
    hint: "Upload a supplier's CSV as they send it, check what changes, then apply it.",
  },
  {
    path: '/imports',
    group: 'buying',
    label: 'Price-list log',
    icon: 'history',
    roles: may.importPriceLists,
    hint: 'Every list brought in: who, when, and what it changed.',
  },
  {
    path: '/suppliers/unmapped',
    group: 'buying',
    label: 'Items to map',
    icon: 'link',
    roles: may.editSuppliers,
    hint: 'Supplier items not linked to our parts yet, with suggestions.',
  },
  {
    path: '/alerts',
    group: 'buying',
    label: 'Stock alerts',
    icon: 'notifications',
    roles: may.handleAlerts,
    hint: 'Parts that fell to their reorder point; mark each as seen.',
  },
  {
    path: '/purchasing/reorder',
    group: 'buying',
    label: 'Reorder',
    icon: 'production_quantity_limits',
    roles: may.buy,
    hint: 'What is low, how much to order, and drafts at the best supplier.',
  },
  {
    path: '/purchasing/sourcing',
    group: 'buying',
    label: 'Sourcing',
    icon: 'travel_explore',
    roles: may.buy,
    hint: 'Who still has a step, at what landed cost, and by when.',
  },
  {
    path: '/purchasing/orders',
    group: 'buying',
    label: 'Purchase orders',
    icon: 'receipt',
    roles: ROLES,
    hint: 'Orders drafted, sent out and coming in; jobs waiting on them.',
  },
  {
    path: '/purchasing/rates',
    group: 'buying',
    label: 'Exchange rates',
    icon: 'currency_exchange',
    roles: may.buy,
    hint: 'What each supplier currency is worth here, for landed costs.',
  },
  {
    path: '/alerts/mailbox',
    group: 'shop',
    label: 'Mailbox',
    icon: 'mail',
    roles: may.administer,
    hint: 'Every e-mail Stepstock sent, while no outside mail server is set up.',
  },
  {
    path: '/account',
    group: 'shop',
    label: 'My account',
    icon: 'manage_accounts',
    roles: ROLES,
    hint: 'Change your password and choose inches or millimetres.',
  },
];

/** The entries a role may see, in the order they are declared. */
export function navItemsFor(role: Role, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) => item.roles.includes(role));
}

/** One section of a role's navigation with the entries that role may see. */
export interface NavGroup {
  id: NavGroupId;
  label: string;
  items: NavItem[];
}

/** A role's navigation in its named groups; a group with nothing for the role is left out. */
export function navGroupsFor(role: Role, items: readonly NavItem[] = NAV_ITEMS): NavGroup[] {
  const mine = navItemsFor(role, items);
  return NAV_GROUPS.map((group) => ({
    id: group.id,
    label: group.label,
    items: mine.filter((item) => item.group === group.id),
  })).filter((group) => group.items.length > 0);
}

/**
 * The one entry to highlight for a URL: the entry whose path is the longest whole-segment prefix
 * of it, so "/jobs/new" lights "Take in a job" only, and "/jobs/1234" still lights "Job bench".
 */
export function activeNavPath(url: string, items: readonly NavItem[]): string | null {
  const path = url.split(/[?#]/)[0].replace(/\/+$/, '') || '/';
  let best: string | null = null;
  for (const item of items) {
    const matches =
      item.path === '/' ? path === '/' : path === item.path || path.startsWith(`${item.path}/`);
    if (matches && (best === null || item.path.length > best.length)) best = item.path;
  }
  return best;
}
