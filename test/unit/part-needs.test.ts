// The wording every page uses for what a step or a job lacks. Product wording, not a computation
// (no outside source): these checks keep the piston-first order and the joining words fixed.
import { emptyStepWords, orderedParts, waitingForWords } from '../../shared/part-needs';

describe('part needs wording', () => {
  it('when parts come in any order or twice, then they are given piston first, once', () => {
    expect(orderedParts(['rings', 'piston', 'rings'])).toEqual(['piston', 'rings']);
    expect(orderedParts(['kit'])).toEqual([]);
  });

  it('when a job waits, then it says for which part', () => {
    expect(waitingForWords(['piston'])).toBe('a piston');
    expect(waitingForWords(['rings'])).toBe('a ring set');
    expect(waitingForWords(['rings', 'piston'])).toBe('a piston and a ring set');
    expect(waitingForWords([])).toBe('');
  });

  it('when a step is empty, then it says what is not free', () => {
    expect(emptyStepWords(['rings'])).toBe('no free ring set');
    expect(emptyStepWords(['piston', 'rings'])).toBe('no free piston and no free ring set');
  });
});
