import {
  booleanAttribute,
  ChangeDetectionStrategy,
  Component,
  computed,
  input,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import type { Loaded } from '../ui/load';

/**
 * A figure of the insights pages: a heading, its chart and its table side by side (stacked on a
 * narrow screen and on paper), a CSV download, and designed loading, error and empty states, all
 * read from the loader of its figures (`[source]`: its loading, its error, "Try again" reloads it).
 */
@Component({
  selector: 'app-insight-panel',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './insight-panel.html',
  styleUrl: './insight-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { role: 'region', '[attr.aria-label]': 'heading()' },
})
export class InsightPanel {
  readonly heading = input.required<string>();
  readonly note = input('');
  readonly csvHref = input<string | null>(null);
  readonly csvName = input('');
  readonly source = input.required<Pick<Loaded<unknown>, 'loading' | 'error' | 'reload'>>();
  readonly empty = input(false);
  readonly emptyText = input('Nothing to show for this period.');
  /** Chart and table side by side (false: the table alone, full width). */
  readonly withChart = input(true);
  /** The chart above the table instead of beside it: for a table with many figure columns. */
  readonly chartAbove = input(false, { transform: booleanAttribute });

  protected readonly loading = computed(() => this.source().loading());
  protected readonly error = computed(() => this.source().error());
}
