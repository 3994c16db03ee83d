import { signal } from '@angular/core';
import type { AbstractControl, FormGroup, ValidationErrors, ValidatorFn } from '@angular/forms';
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

/** One reason the schema gave, as zod reports it. */
interface Issue {
  readonly path: readonly PropertyKey[];
  readonly message: string;
}

/**
 * The reasons shown under a form's own fields, one each, whether the schema found them before
 * sending or the server answered with them: `errors()` for the template, and each control marked
 * (`server`) and touched so its field shows the error. A reason for a field the form lacks is
 * left out (the page says the server's message instead).
 */
export class FieldMarks<F extends string> {
  readonly errors = signal<Partial<Record<F, string>>>({});

  constructor(
    private readonly form: FormGroup,
    private readonly fields: readonly F[],
  ) {}

  /** The first issue for each field, in the form's words (`words`, e.g. a sentence). */
  showIssues(issues: readonly Issue[], words: (message: string) => string = (m) => m): void {
    const errors: Partial<Record<F, string>> = {};
    for (const issue of issues) {
      const field = String(issue.path[0] ?? '') as F;
      if (this.fields.includes(field) && !errors[field]) errors[field] = words(issue.message);
    }
    this.show(errors);
  }

  /** The server's reasons for the form's fields; false when it named none of them. */
  showServer(error: unknown): boolean {
    const fields = apiFieldErrors(error);
    const known: Partial<Record<F, string>> = {};
    for (const f of this.fields) if (fields[f]) known[f] = fields[f];
    this.show(known);
    return Object.keys(known).length > 0;
  }

  /** No reasons: a fresh start for the form. */
  clear(): void {
    this.errors.set({});
  }

  private show(errors: Partial<Record<F, string>>): void {
    this.errors.set(errors);
    for (const f of this.fields) {
      const control = this.form.get(f);
      control?.setErrors(errors[f] ? { server: true } : null);
      if (errors[f]) control?.markAsTouched();
    }
  }
}
