// Which lines Stepstock proposes from a job: the rule is the shop's own (common practice, no source):
// honing follows every bored cylinder, port chamfering only two-strokes, cleaning every job.
import { proposeLines } from '../../shared/estimate-proposal';
import type { ProposalOperation } from '../../shared/estimate-proposal';

const OPS: ProposalOperation[] = [
  { id: 'bore', name: 'Bore one cylinder', per: 'cylinder', price: '55', proposeFor: 'bored' },
  {
    id: 'chamfer',
    name: 'Chamfer the port edges',
    per: 'cylinder',
    price: '18.5',
    proposeFor: 'bored_two_stroke',
  },
  { id: 'clean', name: 'Clean and inspect', per: 'job', price: '12.00', proposeFor: 'every_job' },
  { id: 'sleeve', name: 'Fit a sleeve', per: 'cylinder', price: '140.00', proposeFor: 'never' },
];

describe('proposeLines', () => {
  it('when a two-stroke twin has both cylinders bored, then boring ×2, chamfering ×2 and one cleaning are proposed; sleeving is not', () => {
    const lines = proposeLines({ strokeType: 'two', cylinders: 2, bored: [1, 2] }, OPS, [], 'EUR');
    expect(lines.map((l) => [l.key, l.quantity, l.unitPrice, l.description])).toEqual([
      ['labour:bore', '2', '55.00', 'Bore one cylinder (cylinders 1, 2)'],
      ['labour:chamfer', '2', '18.50', 'Chamfer the port edges (cylinders 1, 2)'],
      ['labour:clean', '1', '12.00', 'Clean and inspect'],
    ]);
  });

  it('when a four-stroke has one of four cylinders bored, then no chamfering, boring ×1', () => {
    const lines = proposeLines({ strokeType: 'four', cylinders: 4, bored: [3] }, OPS, [], 'EUR');
    expect(lines.map((l) => [l.key, l.quantity])).toEqual([
      ['labour:bore', '1'],
      ['labour:clean', '1'],
    ]);
  });

  it('when a piston and a ring set are held, then each is a part line at its sale price, rounded to the currency', () => {
    const lines = proposeLines(
      { strokeType: 'four', cylinders: 1, bored: [] },
      [],
      [
        {
          id: 'h1',
          cylinder: 1,
          partId: 'p1',
          sku: 'PST-1',
          description: 'Cast piston +0.50',
          salePrice: '89.0000',
          quantity: 1,
        },
        {
          id: 'h2',
          cylinder: 1,
          partId: 'p2',
          sku: 'RNG-1',
          description: 'Ring set +0.50',
          salePrice: '34.505',
          quantity: 1,
        },
      ],
      'EUR',
    );
    expect(lines.map((l) => [l.key, l.kind, l.unitPrice, l.description])).toEqual([
      ['hold:h1', 'part', '89.00', 'Cast piston +0.50 (PST-1), cylinder 1'],
      ['hold:h2', 'part', '34.51', 'Ring set +0.50 (RNG-1), cylinder 1'],
    ]);
  });
});
