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
