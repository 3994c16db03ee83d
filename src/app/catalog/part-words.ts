import type { PartKind } from '../../../shared/api/catalog';

/** How each kind of part reads on screen. */
export const KIND_LABELS: Record<PartKind, string> = {
  piston: 'Piston',
  rings: 'Ring set',
  kit: 'Kit',
  other: 'Small part',
};
