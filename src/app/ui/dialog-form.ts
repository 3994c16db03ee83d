import { booleanAttribute, ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';

import { FormAlert } from './form-alert';

/** What the frame shows of a dialog's save (`DialogSave`): why it failed, and whether it runs. */
export interface DialogSaving {
  problem(): string;
  busy(): boolean;
}

/**
 * The frame of a dialog that is one form: its title, the reason the last save failed above the
 * fields, and Cancel beside the button that sends.
 *
 *     <app-dialog-form heading="Move a piston" [formGroup]="form" (ngSubmit)="submit()"
 *       [save]="save" action="Move">…the fields…</app-dialog-form>
 *
 * The page's `[formGroup]` sits on this element, not on the `<form>` inside: the fields are the
 * page's own content, and they find their form through the element they are written in. The
 * inner form's submit (a press of the button, Enter in a field) bubbles up to it.
 * `busyAction` is the button's words while the save runs, `cancel` the other button's,
 * `[blocked]` holds the send button for a reason of the dialog's own, `danger` paints it red.
 */
@Component({
  selector: 'app-dialog-form',
  imports: [FormAlert, MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>{{ heading() }}</h2>
    <form novalidate>
      <mat-dialog-content class="dialog-form">
        <app-form-alert [message]="save().problem()" />
        <ng-content />
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>{{ cancel() }}</button>
        <button
          mat-flat-button
          type="submit"
          [class.danger]="danger()"
          [disabled]="save().busy() || blocked()"
        >
          {{ save().busy() && busyAction() ? busyAction() : action() }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    button.danger {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  // The title and the form stand in the dialog as if the dialog had written them itself.
  host: { style: 'display: contents' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DialogForm {
  readonly heading = input.required<string>();
  readonly save = input.required<DialogSaving>();
  /** The send button's words: "Save", "Add series". */
  readonly action = input.required<string>();
  readonly busyAction = input('');
  readonly cancel = input('Cancel');
  readonly blocked = input(false);
  readonly danger = input(false, { transform: booleanAttribute });
}
