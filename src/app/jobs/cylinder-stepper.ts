import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

/** Previous and next cylinder of the job, for working through a block one bore at a time. */
@Component({
  selector: 'app-cylinder-stepper',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  template: `
    <nav class="stepper no-print" aria-label="Cylinders of this job">
      @if (n() > 1) {
        <a mat-stroked-button [routerLink]="['/jobs', jobId(), 'cylinders', n() - 1]">
          <mat-icon>chevron_left</mat-icon>
          Previous cylinder
        </a>
      } @else {
        <span class="end"></span>
      }
      <span class="where" aria-live="polite">Cylinder {{ n() }} of {{ count() }}</span>
      @if (n() < count()) {
        <a mat-flat-button [routerLink]="['/jobs', jobId(), 'cylinders', n() + 1]">
          Next cylinder
          <mat-icon iconPositionEnd>chevron_right</mat-icon>
        </a>
      } @else {
        <span class="end"></span>
      }
    </nav>
  `,
  styles: `
    .stepper {
      display: grid;
      grid-template-columns: 1fr auto 1fr;
      gap: 12px;
      align-items: center;
      margin: 0 0 16px;

      a {
        min-height: 56px;
        font-size: 1.05rem;
      }
      a:last-child {
        justify-self: end;
      }
    }
    .where {
      font: var(--mat-sys-title-large);
      text-align: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderStepper {
  readonly jobId = input.required<string>();
  readonly n = input.required<number>();
  readonly count = input.required<number>();
  protected readonly last = computed(() => this.n() >= this.count());
}
