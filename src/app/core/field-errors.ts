import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type * as z from '../../../shared/zod';

import { apiErrorBody, apiFieldErrors, apiUnplacedMessage, detailSentence } from './api-error';

/**
 * Puts each field error of a failed request under its own control (found by the detail's path,
 * "lines.0.quantity" included) and returns what is left to say above the form, or '' when every
 * error found its field. The control's own validators clear the mark at the next edit.
 */
export function placeApiErrors(
  form: AbstractControl,
  error: unknown,
  labels: Readonly<Record<string, string>> = {},
  aliases: Readonly<Record<string, string>> = {},
): string {
  const fields = apiFieldErrors(error);
  const placed = new Set<string>();
  for (const [field, message] of Object.entries(fields)) {
    const control = form.get(aliases[field] ?? field);
    if (!control || control === form) continue;
    control.setErrors({ ...(control.errors ?? {}), server: message });
    control.markAsTouched();
    placed.add(field);
  }
  if (!apiErrorBody(error)) return apiUnplacedMessage(error, () => false, labels);
  const rest = apiUnplacedMessage(error, (field) => placed.has(field), labels);
  return rest === 'Check the marked fields.' && placed.size > 0 ? '' : rest;
}

/** The words under a field: the server's reason first, then the common validators'. */
export function controlError(control: AbstractControl | null, what = 'a value'): string {
  const errors = control?.errors;
  if (!errors) return '';
  if (typeof errors['server'] === 'string') return errors['server'];
  if (typeof errors['schema'] === 'string') return errors['schema'];
  if (errors['required']) return `Enter ${what}.`;
  if (errors['min']) return `Must be at least ${errors['min'].min}.`;
  if (errors['max']) return `Must be at most ${errors['max'].max}.`;
  if (errors['maxlength']) return `At most ${errors['maxlength'].requiredLength} characters.`;
  if (errors['email']) return 'That is not an e-mail address.';
  if (errors['pattern']) return 'Not in the expected form.';
  return '';
}

/**
 * Checks a control with the server's own zod rule for that field, at every keystroke, so the form
 * refuses what the server would and says it in the same words (as `schema`, a sentence).
 */
export function schemaValidator(rule: z.ZodMiniType): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const checked = rule.safeParse(control.value);
    if (checked.success) return null;
    const message = checked.error.issues[0]?.message ?? 'not valid';
    return { schema: detailSentence({ message }).replace(/^./, (c) => c.toUpperCase()) };
  };
}

/**
 * The server's own rule for each field of a contract's object schema, as validators:
 * `const rule = fieldRules(familyInput)`, then `code: ['', [Validators.required, rule('code')]]`.
 */
export function fieldRules<Shape extends Record<string, z.ZodMiniType>>(schema: {
  shape: Shape;
}): (field: keyof Shape) => ValidatorFn {
  return (field) => schemaValidator(schema.shape[field]);
}
