import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/** One figure at the top of an insights page; `aside` is a small addition, such as its share. */
export interface HeadlineFigure {
  readonly label: string;
  readonly figure: string;
  readonly aside?: string | null;
}

/** The few figures an insights page opens with, as a named list of tiles (none until one is known). */
@Component({
  selector: 'app-headline-figures',
  template: `
    @if (figures().length) {
      <ul class="headline" [attr.aria-label]="label()">
        @for (f of figures(); track f.label) {
          <li>
            <span class="label">{{ f.label }}</span>
            <span class="figure"
              >{{ f.figure }}
              @if (f.aside) {
                <small>{{ f.aside }}</small>
              }
            </span>
          </li>
        }
      </ul>
    }
  `,
  styleUrl: './_headline.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HeadlineFigures {
  /** The list's accessible name: "Totals for the period". */
  readonly label = input.required<string>();
  readonly figures = input.required<readonly HeadlineFigure[]>();
}
