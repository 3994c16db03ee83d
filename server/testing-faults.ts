// Named fault points let the API tests prove that a use case is one transaction: a test arms a
// point, the service throws there, and the test checks that nothing was written. Armed only when
// NODE_ENV is 'test'; in every other environment `faultPoint` does nothing.
const armed = new Set<string>();

export function armFault(name: string): void {
  if (process.env.NODE_ENV !== 'test') throw new Error('Faults can only be armed in tests.');
  armed.add(name);
}

export function disarmFaults(): void {
  armed.clear();
}

export function faultPoint(name: string): void {
  if (armed.has(name)) {
    armed.delete(name);
    throw new Error(`Injected fault at ${name}`);
  }
}
