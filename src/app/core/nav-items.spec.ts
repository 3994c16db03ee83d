import { ROLES, type Role } from '../../../shared/session-types';
import { NAV_ITEMS, navItemsFor, type NavItem } from './nav-items';

describe('navItemsFor', () => {
  const items: NavItem[] = [
    { path: '/', label: 'Home', icon: 'home', roles: [...ROLES] },
    { path: '/a', label: 'Owner only', icon: 'x', roles: ['owner'] },
    { path: '/b', label: 'Buyer and staff', icon: 'x', roles: ['buyer', 'staff'] },
    { path: '/c', label: 'Machinist', icon: 'x', roles: ['machinist'] },
  ];

  it.each<[Role, string[]]>([
    ['owner', ['/', '/a']],
    ['buyer', ['/', '/b']],
    ['machinist', ['/', '/c']],
    ['staff', ['/', '/b']],
  ])('when the role is %s, then only its entries show, in declared order', (role, paths) => {
    expect(navItemsFor(role, items).map((item) => item.path)).toEqual(paths);
  });

  it('when the shipped list is read, then Users is for owners only and Home and My account for all', () => {
    expect(navItemsFor('owner').map((item) => item.label)).toEqual(
      expect.arrayContaining(['Home', 'Users', 'My account']),
    );
    for (const role of ROLES.filter((r) => r !== 'owner')) {
      const labels = navItemsFor(role).map((item) => item.label);
      expect(labels).toEqual(expect.arrayContaining(['Home', 'My account']));
      expect(labels).not.toContain('Users');
    }
  });

  it('when the shipped list is read, then every entry has an absolute path and one known role at least', () => {
    for (const item of NAV_ITEMS) {
      expect(item.path.startsWith('/')).toBe(true);
      expect(item.roles.length).toBeGreaterThan(0);
      expect(item.roles.every((role) => ROLES.includes(role))).toBe(true);
    }
    expect(new Set(NAV_ITEMS.map((item) => item.path)).size).toBe(NAV_ITEMS.length);
  });
});
