// The values a shop usually sets, so a setting far outside them is questioned (not refused): a
// deepest cut of 0.5 in per pass is a slip of the decimal point, not a policy. Each range says
// where it comes from; the machine maker's figures always come before these.
import { formatLength, NM_PER_MM, parseLength, type LengthUnit, type Nm } from './lengths';
import type { ShopSettingsJson } from './api/settings';

type Source = 'common practice (no source)' | 'from memory';

interface LengthRange {
  kind: 'length';
  lowNm: Nm;
  highNm: Nm;
  what: string;
  source: Source;
}
interface NumberRange {
  kind: 'number';
  low: number;
  high: number;
  what: string;
  suffix?: string;
  source: Source;
}
type UsualRange = LengthRange | NumberRange;

const mm = (value: number): Nm => Math.round(value * NM_PER_MM);

/** Lengths are on the diameter, as the settings form asks for them. */
export const USUAL_SETTING_RANGES: Partial<Record<keyof ShopSettingsJson, UsualRange>> = {
  // A boring bar's roughing cut on a cylinder: a few hundredths of a millimetre up to about a millimetre.
  maxCutPerPass: {
    kind: 'length',
    lowNm: mm(0.05),
    highNm: mm(1),
    what: 'a boring pass',
    source: 'common practice (no source)',
  },
  minCutPerPass: {
    kind: 'length',
    lowNm: mm(0.005),
    highNm: mm(0.1),
    what: 'the lightest cut a bar holds',
    source: 'common practice (no source)',
  },
  finishPass: {
    kind: 'length',
    lowNm: mm(0.01),
    highNm: mm(0.15),
    what: 'a finishing pass',
    source: 'common practice (no source)',
  },
  truingPass: {
    kind: 'length',
    lowNm: mm(0.02),
    highNm: mm(0.3),
    what: 'a first truing pass',
    source: 'common practice (no source)',
  },
  marginalCleanup: {
    kind: 'length',
    lowNm: mm(0.01),
    highNm: mm(0.15),
    what: 'a thin clean-up margin',
    source: 'common practice (no source)',
  },
  holdExpiryDays: {
    kind: 'number',
    low: 3,
    high: 60,
    what: 'keeping a piston aside',
    suffix: ' days',
    source: 'common practice (no source)',
  },
  // Carrying cost of stock is usually quoted as a fifth to a third of its value per year.
  holdingCostRate: {
    kind: 'number',
    low: 0.1,
    high: 0.4,
    what: 'a yearly holding cost',
    source: 'from memory',
  },
  serviceLevel: {
    kind: 'number',
    low: 0.85,
    high: 0.99,
    what: 'a service level',
    source: 'common practice (no source)',
  },
  // The highest standard sales-tax or VAT rates in use are a little under 30 %.
  taxRate: {
    kind: 'number',
    low: 0,
    high: 27,
    what: 'a tax rate',
    suffix: ' %',
    source: 'from memory',
  },
  depositPercent: {
    kind: 'number',
    low: 0,
    high: 75,
    what: 'a deposit',
    suffix: ' %',
    source: 'common practice (no source)',
  },
};

/**
 * A caution when a setting is far outside what shops usually set, with the usual range shown, or
 * null when it is usual (or not readable: the schema says why then).
 */
export function settingWarning(field: keyof ShopSettingsJson, value: unknown): string | null {
  const range = USUAL_SETTING_RANGES[field];
  if (!range) return null;
  if (range.kind === 'length') {
    return typeof value === 'string' ? lengthWarning(range, value) : null;
  }
  const n = typeof value === 'number' ? value : Number(String(value ?? '').trim());
  if (!Number.isFinite(n) || String(value ?? '').trim() === '') return null;
  if (n >= range.low && n <= range.high) return null;
  const suffix = range.suffix ?? '';
  return `Outside the usual ${range.low}–${range.high}${suffix} for ${range.what}. Check the value.`;
}

function lengthWarning(range: LengthRange, text: string, defaultUnit?: LengthUnit): string | null {
  if (text.trim() === '') return null;
  const parsed = parseLength(text, defaultUnit ? { defaultUnit, allowZero: true } : {});
  if (!parsed.ok) return null;
  if (parsed.nm >= range.lowNm && parsed.nm <= range.highNm) return null;
  const unit: LengthUnit = parsed.unit;
  const other: LengthUnit = unit === 'mm' ? 'in' : 'mm';
  const span = (u: LengthUnit) =>
    `${formatLength(range.lowNm, u, false)}–${formatLength(range.highNm, u)}`;
  return `Far outside the usual ${span(unit)} (${span(other)}) for ${range.what}. Check the value; the machine maker's figures come first.`;
}

const length = (low: number, high: number, what: string): LengthRange => ({
  kind: 'length',
  lowNm: mm(low),
  highNm: mm(high),
  what,
  source: 'common practice (no source)',
});

/**
 * An engine family's figures as shops usually meet them, on the diameter (all common practice,
 * no source): a family far outside is most often a slip of unit or decimal point. The engine
 * maker's own figures always win; these only ask to check.
 */
export const USUAL_FAMILY_RANGES: Record<string, LengthRange> = {
  clearanceMin: length(0.01, 0.15, 'a piston-to-wall clearance'),
  clearanceMax: length(0.01, 0.15, 'a piston-to-wall clearance'),
  // Forged pistons grow more when hot and are fitted looser.
  forgedClearanceMin: length(0.02, 0.25, "a forged piston's clearance"),
  forgedClearanceMax: length(0.02, 0.25, "a forged piston's clearance"),
  honeAllowance: length(0.01, 0.15, 'the stock left for the hone'),
  cleanup: length(0.02, 0.25, 'a clean-up allowance'),
  maxOversize: length(0.25, 3, 'the largest oversize'),
  maxTaper: length(0.005, 0.2, 'a taper limit'),
  maxOutOfRound: length(0.005, 0.15, 'an out-of-round limit'),
};

/** Like settingWarning, for an engine family's figure typed in the person's unit. */
export function familyWarning(key: string, text: string, unit: LengthUnit): string | null {
  const range = USUAL_FAMILY_RANGES[key];
  return range ? lengthWarning(range, text, unit) : null;
}
