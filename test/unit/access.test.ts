import { allows, may, type Action } from '../../shared/access';
import { ROLES } from '../../shared/session-types';

const ACTIONS = Object.keys(may) as Action[];

describe('who may do what', () => {
  // The roles as the project's ARCHITECTURE.md describes them: the owner does everything; the
  // machinist's work is jobs, readings, holds and bore sheets, not buying or price lists.
  it('when any action is asked about, then the owner may do it', () => {
    for (const action of ACTIONS) expect(allows('owner', action)).toBe(true);
  });

  it('when the machinist asks to edit prices, buy, import a price list or read sales, then no', () => {
    for (const action of ['editCatalog', 'buy', 'importPriceLists', 'readSales'] as const) {
      expect(allows('machinist', action)).toBe(false);
    }
    expect(allows('machinist', 'machine')).toBe(true);
  });

  it('when nobody is signed in (or the session is not loaded yet), then nothing is allowed', () => {
    for (const action of ACTIONS) {
      expect(allows(null, action)).toBe(false);
      expect(allows(undefined, action)).toBe(false);
    }
  });

  it('when the table is read, then every action names known roles only, each once', () => {
    for (const action of ACTIONS) {
      const roles = may[action] as readonly string[];
      expect(roles.length).toBeGreaterThan(0);
      expect(new Set(roles).size).toBe(roles.length);
      expect(roles.every((role) => (ROLES as string[]).includes(role))).toBe(true);
    }
  });
});
