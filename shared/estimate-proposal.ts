// Which lines Stepstock proposes on a job's estimate from what it knows about the job: each labour
// operation marked for this kind of job (every cylinder with a step chosen, two-strokes only, every
// job), and each held piston and ring set at its sale price. Each line has a key, so proposing again
// after the job changed updates the same line instead of adding a second one.
import type { LabourPer, ProposeFor } from './api/money';
import { fixedMoney } from './estimate-math';

export interface ProposalOperation {
  id: string;
  name: string;
  per: LabourPer;
  price: string;
  proposeFor: ProposeFor;
}

export interface ProposalHold {
  id: string;
  cylinder: number;
  partId: string;
  sku: string;
  description: string;
  salePrice: string;
  quantity: number;
}

export interface ProposalJob {
  strokeType: 'two' | 'four';
  cylinders: number;
  /** Numbers of the cylinders with a step chosen (to be bored). */
  bored: number[];
}

export interface ProposedLine {
  key: string;
  kind: 'labour' | 'part';
  description: string;
  quantity: string;
  unitPrice: string;
  labourOperationId: string | null;
  partId: string | null;
}

function cylinderList(ns: number[]): string {
  return ns.length === 1 ? `cylinder ${ns[0]}` : `cylinders ${ns.join(', ')}`;
}

export function proposeLines(
  job: ProposalJob,
  operations: readonly ProposalOperation[],
  holds: readonly ProposalHold[],
  currency: string,
): ProposedLine[] {
  const lines: ProposedLine[] = [];
  const every = Array.from({ length: job.cylinders }, (_, i) => i + 1);
  for (const op of operations) {
    let cylinders: number[];
    if (op.proposeFor === 'bored') cylinders = job.bored;
    else if (op.proposeFor === 'bored_two_stroke')
      cylinders = job.strokeType === 'two' ? job.bored : [];
    else if (op.proposeFor === 'every_job') cylinders = every;
    else cylinders = [];
    if (cylinders.length === 0) continue;
    const perCylinder = op.per === 'cylinder';
    lines.push({
      key: `labour:${op.id}`,
      kind: 'labour',
      description: perCylinder ? `${op.name} (${cylinderList(cylinders)})` : op.name,
      quantity: perCylinder ? String(cylinders.length) : '1',
      unitPrice: fixedMoney(op.price, currency),
      labourOperationId: op.id,
      partId: null,
    });
  }
  for (const h of holds) {
    lines.push({
      key: `hold:${h.id}`,
      kind: 'part',
      description: `${h.description} (${h.sku}), cylinder ${h.cylinder}`,
      quantity: String(h.quantity),
      unitPrice: fixedMoney(h.salePrice, currency),
      labourOperationId: null,
      partId: h.partId,
    });
  }
  return lines;
}
