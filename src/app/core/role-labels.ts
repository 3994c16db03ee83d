import type { Role } from '../../../shared/session-types';

/** How a role reads on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  buyer: 'Buyer',
  machinist: 'Machinist',
  staff: 'Staff',
};

/** What each role looks after, for the greeting on the home page. */
export const ROLE_SUMMARIES: Record<Role, string> = {
  owner: 'You look after the whole shop: people, settings, stock and the figures.',
  buyer: 'You keep the shelves stocked: suppliers, price lists, reorders and purchase orders.',
  machinist: 'You measure bores, hold the right piston for each job and cut to size.',
  staff: 'You take jobs in, receive deliveries and bring in price lists.',
};
