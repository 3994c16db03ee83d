// After-honing sizes typed against an earlier state (a tablet that was offline at the hone, or two
// people on one cylinder) never overwrite newer ones: the client sends the sizes it last read, and a
// size stored differently since is refused with both versions, so the machinist chooses.
import { Conflict } from '../errors';
import { toLengthJson, type LengthJson, type Nm } from '../../shared/lengths';
import type { CylinderPatch } from '../../shared/api/jobs';
import type { CylinderRow } from './job-records-repository';

type Seen = LengthJson | null | undefined;

function same(nm: Nm | null, seen: LengthJson | null): boolean {
  if (nm === null || seen === null) return nm === null && seen === null;
  const stored = toLengthJson(nm);
  return stored.mm === seen.mm && stored.in === seen.in;
}

const FIELDS = [
  { key: 'measuredAfterHone', column: 'measured_after_hone_nm', name: 'honed bore' },
  { key: 'ringGap', column: 'ring_gap_nm', name: 'ring end gap' },
] as const;

export function refuseStaleFinish(jobNumber: string, cylinder: CylinderRow, patch: CylinderPatch) {
  const based = patch.basedOn;
  if (!based) return;
  const stale = FIELDS.filter(({ key, column }) => {
    const sent = patch[key];
    const seen: Seen = based[key];
    if (sent === undefined || seen === undefined) return false;
    const stored = cylinder[column];
    // Someone else already stored the very size sent: nothing would be lost.
    if (stored === sent) return false;
    return !same(stored, seen);
  });
  if (stale.length === 0) return;
  const json = (nm: Nm | null | undefined) =>
    nm === null || nm === undefined ? null : toLengthJson(nm);
  throw new Conflict(
    `The ${stale.map((f) => f.name).join(' and ')} of cylinder ${cylinder.n} of job ${jobNumber} ${stale.length === 1 ? 'was' : 'were'} changed since this was typed; compare both and send the right one again.`,
    'stale_cylinder',
    {
      stored: {
        measuredAfterHone: json(cylinder.measured_after_hone_nm),
        ringGap: json(cylinder.ring_gap_nm),
      },
      yours: {
        basedOn: based,
        measuredAfterHone:
          patch.measuredAfterHone === undefined ? undefined : json(patch.measuredAfterHone),
        ringGap: patch.ringGap === undefined ? undefined : json(patch.ringGap),
      },
    },
  );
}
