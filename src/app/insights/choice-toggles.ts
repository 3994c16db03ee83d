import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';

export interface Choice<T> {
  readonly value: T;
  readonly label: string;
}

/**
 * One choice out of a few, as a row of toggles (months looked back, the figure a chart shows…),
 * named for what it chooses. Not printed: paper shows the figures chosen.
 */
@Component({
  selector: 'app-choice-toggles',
  imports: [MatButtonToggleModule],
  template: `
    <mat-button-toggle-group
      class="toggles no-print"
      [attr.aria-label]="label()"
      [value]="value()"
      (change)="chosen.emit($event.value)"
    >
      @for (c of choices(); track c.value) {
        <mat-button-toggle [value]="c.value">{{ c.label }}</mat-button-toggle>
      }
    </mat-button-toggle-group>
  `,
  styles: `
    .toggles {
      --mat-standard-button-toggle-height: 44px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChoiceToggles<T> {
  /** What is chosen, for the group's accessible name: "Months looked back". */
  readonly label = input.required<string>();
  readonly choices = input.required<readonly Choice<T>[]>();
  readonly value = input.required<T>();
  readonly chosen = output<T>();
}
