// How many complete kits (piston, ring set, pin, clips …) can be put together from free stock: the scarcest
// component, counted in kits, decides.

export interface KitComponent {
  free: number;
  perKit: number;
}

export function kitFree(components: readonly KitComponent[]): number {
  if (!Array.isArray(components) || components.length === 0) {
    throw new Error('A kit needs at least one component.');
  }
  return Math.min(
    ...components.map((c, i) => {
      if (!Number.isSafeInteger(c.perKit) || c.perKit < 1) {
        throw new Error(
          `Component ${i + 1}: the quantity per kit must be a whole number, 1 or more.`,
        );
      }
      if (!Number.isSafeInteger(c.free) || c.free < 0) {
        throw new Error(`Component ${i + 1}: free stock must be a whole number, 0 or more.`);
      }
      return Math.floor(c.free / c.perKit);
    }),
  );
}
