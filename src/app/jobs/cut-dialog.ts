import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { CUT_UNDO_MINUTES } from '../../../shared/cut-undo';

export interface CutDialogData {
  mode: 'cut' | 'undo';
  cylinder: number;
  pistonLabel: string;
  /** Undo by the owner after the cutter's few minutes: a reason is asked for and kept. */
  reasonNeeded: boolean;
}

/** What the dialog answers: null when the person stepped back. */
export type CutDialogResult = { reason: string } | null;

/**
 * Asks before marking a cylinder as cut (it locks the readings and the step and keeps the piston
 * with the bore), and before taking the mark back.
 */
@Component({
  selector: 'app-cut-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    @if (data.mode === 'cut') {
      <h2 mat-dialog-title>Mark cylinder {{ data.cylinder }} as cut?</h2>
      <mat-dialog-content>
        <p>Once it is marked as cut:</p>
        <ul>
          <li>its bore readings and its oversize step are locked;</li>
          <li>
            {{ data.pistonLabel }} stays with this bore and no longer lapses back to the shelf;
          </li>
          <li>the job moves on to the boring bar.</li>
        </ul>
        <p>
          A slip can be taken back by you within {{ minutes }} minutes; after that only the owner
          can, with a reason.
        </p>
      </mat-dialog-content>
    } @else {
      <h2 mat-dialog-title>Take back the cut of cylinder {{ data.cylinder }}?</h2>
      <mat-dialog-content>
        <p>
          Its readings and step can change again, and the job goes back to waiting at the bar if no
          other cylinder is cut. The change is kept in the job's history and the audit trail.
        </p>
        @if (data.reasonNeeded) {
          <mat-form-field appearance="outline" class="reason">
            <mat-label>Why it is taken back (kept with the job)</mat-label>
            <textarea
              matInput
              rows="2"
              maxlength="500"
              [value]="reason()"
              (input)="reason.set($any($event.target).value)"
            ></textarea>
            <mat-hint>At least a few words, e.g. "marked on the wrong cylinder".</mat-hint>
          </mat-form-field>
        }
      </mat-dialog-content>
    }
    <mat-dialog-actions align="end">
      <button mat-button type="button" (click)="close(null)">Cancel</button>
      <button
        mat-flat-button
        type="button"
        [disabled]="data.mode === 'undo' && data.reasonNeeded && reason().trim().length < 3"
        (click)="close({ reason: reason().trim() })"
      >
        <mat-icon>{{ data.mode === 'cut' ? 'construction' : 'undo' }}</mat-icon>
        {{ data.mode === 'cut' ? 'Mark as cut' : 'Take back the cut' }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .reason {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CutDialog {
  protected readonly data = inject<CutDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<CutDialog, CutDialogResult>>(MatDialogRef);
  protected readonly minutes = CUT_UNDO_MINUTES;
  protected readonly reason = signal('');

  protected close(result: CutDialogResult): void {
    this.ref.close(result);
  }
}
