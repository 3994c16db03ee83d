import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';

import {
  formatLength,
  parseLength,
  type LengthJson,
  type LengthUnit,
  type ParseLengthOptions,
} from '../../../shared/lengths';

/** True when the text is a bare number ("2.5555"), so the person's own unit applies. */
function isBareNumber(text: string): boolean {
  return /^\s*\+?[0-9]*[.,]?[0-9]+\s*$/.test(text);
}

/**
 * What the API is sent for a length typed in a form: the text as typed, with the person's unit
 * added when they gave none ("2.5555" → "2.5555 in"). The server reads it exactly.
 */
export function lengthText(text: string, unit: LengthUnit): string {
  const trimmed = text.trim();
  return isBareNumber(trimmed) ? `${trimmed} ${unit}` : trimmed;
}

/**
 * Checks a typed length with the same reader the server uses; the error carries its message.
 * An empty field passes unless `required` (pair with Validators.required for the message).
 */
export function lengthValidator(
  unit: () => LengthUnit,
  opts: ParseLengthOptions & { required?: boolean } = {},
): ValidatorFn {
  return (control: AbstractControl<string | null>): ValidationErrors | null => {
    const text = control.value ?? '';
    if (text.trim() === '') return null;
    const parsed = parseLength(text, { ...opts, defaultUnit: unit() });
    return parsed.ok ? null : { length: parsed.message };
  };
}

/** "= 64.9097 mm" under a field typed in inches, so a slip of unit shows before saving. */
export function otherUnitHint(
  text: string | null,
  unit: LengthUnit,
  opts: ParseLengthOptions = {},
): string {
  if (!text || text.trim() === '') return '';
  const parsed = parseLength(text, { ...opts, defaultUnit: unit });
  if (!parsed.ok) return '';
  const other: LengthUnit = parsed.unit === 'mm' ? 'in' : 'mm';
  return `= ${formatLength(parsed.nm, other)}`;
}

/** A stored length written back into a field in the person's unit, from the API's exact strings. */
export function lengthForField(value: LengthJson | null | undefined, unit: LengthUnit): string {
  if (!value) return '';
  return unit === 'in' ? value.in : value.mm;
}
