import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';

import type { JobJson } from '../../../shared/api/jobs';
import { LengthPipe } from '../core/length-pipe';

export interface JobCloseData {
  job: JobJson;
  mode: 'collect' | 'cancel';
}

/** Asks before handing a job back (the held parts are issued) or calling it off (they go back). */
@Component({
  selector: 'app-job-close-dialog',
  imports: [LengthPipe, MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>
      {{ data.mode === 'collect' ? 'Hand back ' : 'Call off ' }}{{ data.job.number }}?
    </h2>
    <mat-dialog-content>
      @if (data.job.holds.length > 0) {
        <p>
          @if (data.mode === 'collect') {
            These parts go out with the job and are billed:
          } @else {
            These parts go back on the shelf, free for other jobs:
          }
        </p>
        <ul class="parts">
          @for (hold of data.job.holds; track hold.id) {
            <li>
              Cylinder {{ hold.cylinder }}:
              <strong>{{ hold.unitLabel ?? hold.sku }}</strong>
              {{ hold.description }}
              @if (hold.skirt) {
                , skirt {{ hold.skirt | length }}
              }
              @if (hold.quantity > 1) {
                × {{ hold.quantity }}
              }
            </li>
          }
        </ul>
      } @else {
        <p>
          No parts are held for this job, so nothing is
          {{ data.mode === 'collect' ? 'issued' : 'released' }}.
        </p>
      }
      <p>The job then closes and can no longer change.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Keep it open</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true">
        <mat-icon>{{ data.mode === 'collect' ? 'handshake' : 'block' }}</mat-icon>
        {{ data.mode === 'collect' ? 'Hand back and issue parts' : 'Call off and release parts' }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .parts {
      margin: 0 0 12px;
      padding-left: 20px;
      line-height: 1.6;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobCloseDialog {
  protected readonly data = inject<JobCloseData>(MAT_DIALOG_DATA);
}
