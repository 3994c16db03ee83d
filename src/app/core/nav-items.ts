import { ROLES, type Role } from '../../../shared/session-types';

/** One entry of the side navigation, and one card on the home page. */
export interface NavItem {
  /** Absolute router path, e.g. '/admin/users'. */
  path: string;
  label: string;
  /** A Material Symbols Outlined ligature name, e.g. 'group'. */
  icon: string;
  /** Who sees the entry; keep it equal to the `data.roles` of the route it opens. */
  roles: Role[];
  /** One line for the home page card: what a person does there. */
  hint?: string;
}

/**
 * Everything the side navigation can show, in display order. Each feature appends its own
 * entries here; the shell and the home page show each person only the entries of their role.
 */
export const NAV_ITEMS: NavItem[] = [
  { path: '/', label: 'Home', icon: 'home', roles: [...ROLES] },
  {
    path: '/admin/users',
    label: 'Users',
    icon: 'group',
    roles: ['owner'],
    hint: 'Add people, set what each may do, reset a forgotten password.',
  },
  {
    path: '/admin/settings',
    label: 'Shop settings',
    icon: 'tune',
    roles: ['owner'],
    hint: 'Name and hours, hold expiry, cut per pass, and the costs behind reorder points.',
  },
  {
    path: '/admin/audit',
    label: 'Audit trail',
    icon: 'manage_history',
    roles: ['owner'],
    hint: 'Who changed stock, prices, reorder rules and users, and what it was before.',
  },
  {
    path: '/catalog/families',
    label: 'Engine families',
    icon: 'stairs',
    roles: [...ROLES],
    hint: "Each family's step ladder: every oversize with its measured pistons.",
  },
  {
    path: '/catalog/parts',
    label: 'Parts',
    icon: 'inventory_2',
    roles: [...ROLES],
    hint: 'Pistons, ring sets, kits and small parts; scan a box to find it.',
  },
  {
    path: '/stock/receive',
    label: 'Receive',
    icon: 'move_to_inbox',
    roles: ['owner', 'buyer', 'staff'],
    hint: 'Take a delivery in, measure each piston and print its labels.',
  },
  {
    path: '/stock/units',
    label: 'Pistons on the shelf',
    icon: 'straighten',
    roles: [...ROLES],
    hint: 'Every piston with its measured size, bin and status.',
  },
  {
    path: '/stock/exposure',
    label: 'Empty steps',
    icon: 'report',
    roles: [...ROLES],
    hint: 'Steps with no free piston, the most asked-for first.',
  },
  {
    path: '/stock/bins',
    label: 'Bins',
    icon: 'shelves',
    roles: ['owner', 'buyer', 'staff'],
    hint: 'Where things sit; print bin labels.',
  },
  {
    path: '/stock/ledger',
    label: 'Stock movements',
    icon: 'receipt_long',
    roles: [...ROLES],
    hint: 'Every receipt, count, move and write-off, with who and why.',
  },
  {
    path: '/jobs',
    label: 'Job bench',
    icon: 'view_kanban',
    roles: [...ROLES],
    hint: 'Every open job by stage, due date first, and which are waiting for parts.',
  },
  {
    path: '/jobs/new',
    label: 'Take in a job',
    icon: 'add_box',
    roles: ['owner', 'machinist', 'staff'],
    hint: 'Book a cylinder in: customer, engine, cylinders, what they want and by when.',
  },
  {
    path: '/insights/sales',
    label: 'What sells',
    icon: 'trending_up',
    roles: ['owner'],
    hint: 'Units, revenue and margin by family and step, month by month.',
  },
  {
    path: '/insights/stock',
    label: 'What sits',
    icon: 'inventory',
    roles: ['owner', 'buyer'],
    hint: 'Money on the shelf, turnover, and parts that have not moved.',
  },
  {
    path: '/insights/abc',
    label: 'ABC classes',
    icon: 'leaderboard',
    roles: ['owner', 'buyer'],
    hint: 'The few parts that carry most of the value, and the long tail.',
  },
  {
    path: '/insights/exposure',
    label: 'Ran short',
    icon: 'hourglass_top',
    roles: ['owner', 'buyer'],
    hint: 'Steps asked for with nothing free, jobs that waited, suppliers that were late.',
  },
  {
    path: '/suppliers',
    label: 'Suppliers',
    icon: 'local_shipping',
    roles: ['owner', 'buyer', 'staff'],
    hint: 'Who sells what, at which price; every price a list has ever given.',
  },
  {
    path: '/imports/new',
    label: 'Bring in a price list',
    icon: 'upload_file',
    roles: ['owner', 'buyer', 'staff'],
    hint: "Upload a supplier's CSV as they send it, check what changes, then apply it.",
  },
  {
    path: '/imports',
    label: 'Price-list log',
    icon: 'history',
    roles: ['owner', 'buyer', 'staff'],
    hint: 'Every list brought in: who, when, and what it changed.',
  },
  {
    path: '/suppliers/unmapped',
    label: 'Items to map',
    icon: 'link',
    roles: ['owner', 'buyer'],
    hint: 'Supplier items not linked to our parts yet, with suggestions.',
  },
  {
    path: '/alerts',
    label: 'Stock alerts',
    icon: 'notifications',
    roles: ['owner', 'buyer'],
    hint: 'Parts that fell to their reorder point; mark each as seen.',
  },
  {
    path: '/purchasing/reorder',
    label: 'Reorder',
    icon: 'production_quantity_limits',
    roles: ['owner', 'buyer'],
    hint: 'What is low, how much to order, and drafts at the best supplier.',
  },
  {
    path: '/purchasing/sourcing',
    label: 'Sourcing',
    icon: 'travel_explore',
    roles: ['owner', 'buyer'],
    hint: 'Who still has a step, at what landed cost, and by when.',
  },
  {
    path: '/purchasing/orders',
    label: 'Purchase orders',
    icon: 'receipt',
    roles: [...ROLES],
    hint: 'Orders drafted, sent out and coming in; jobs waiting on them.',
  },
  {
    path: '/purchasing/receiving',
    label: 'Receive an order',
    icon: 'qr_code_scanner',
    roles: ['owner', 'buyer', 'staff'],
    hint: 'Scan a box, count it, measure each piston; waiting jobs get theirs.',
  },
  {
    path: '/purchasing/rates',
    label: 'Exchange rates',
    icon: 'currency_exchange',
    roles: ['owner', 'buyer'],
    hint: 'What each supplier currency is worth here, for landed costs.',
  },
  {
    path: '/alerts/mailbox',
    label: 'Mailbox',
    icon: 'mail',
    roles: ['owner'],
    hint: 'Every e-mail Stepstock sent, while no outside mail server is set up.',
  },
  {
    path: '/account',
    label: 'My account',
    icon: 'manage_accounts',
    roles: [...ROLES],
    hint: 'Change your password and choose inches or millimetres.',
  },
];

/** The entries a role may see, in the order they are declared. */
export function navItemsFor(role: Role, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) => item.roles.includes(role));
}
