import { ROLES, type Role } from '../../../shared/session-types';
import { activeNavPath, NAV_ITEMS, navGroupsFor, navItemsFor, type NavItem } from './nav-items';

describe('navItemsFor', () => {
  const items: NavItem[] = [
    { path: '/', group: 'today', label: 'Home', icon: 'home', roles: [...ROLES] },
    { path: '/a', group: 'shop', label: 'Owner only', icon: 'x', roles: ['owner'] },
    { path: '/b', group: 'buying', label: 'Buyer and staff', icon: 'x', roles: ['buyer', 'staff'] },
    { path: '/c', group: 'today', label: 'Machinist', icon: 'x', roles: ['machinist'] },
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

describe('navGroupsFor', () => {
  it('when an owner reads the shipped list, then every entry sits in exactly one named group', () => {
    const groups = navGroupsFor('owner');
    expect(groups.flatMap((group) => group.items)).toHaveLength(navItemsFor('owner').length);
    expect(groups.every((group) => group.label.length > 0)).toBe(true);
  });

  it('when a machinist reads it, then groups with nothing for the role are left out', () => {
    expect(navGroupsFor('machinist').every((group) => group.items.length > 0)).toBe(true);
    expect(navGroupsFor('machinist').map((group) => group.id)).not.toContain('figures');
  });
});

describe('activeNavPath', () => {
  it.each([
    ['/jobs/new', '/jobs/new'],
    ['/jobs/4f1c/cylinders/1', '/jobs'],
    ['/jobs?filter=waiting', '/jobs'],
    ['/imports/new', '/imports/new'],
    ['/imports/9a', '/imports'],
    ['/alerts/mailbox', '/alerts/mailbox'],
    ['/', '/'],
    ['/jobsite', null],
  ])('when the page is %s, then only %s is highlighted', (url, path) => {
    expect(activeNavPath(url, NAV_ITEMS)).toBe(path);
  });
});
