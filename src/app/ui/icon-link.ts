import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink, type Params } from '@angular/router';

/**
 * A link that shows only an icon, named for where it goes (aria-label and tooltip alike):
 * `<app-icon-link icon="edit" [link]="['/suppliers', s.id, 'edit']" [label]="'Edit ' + s.name" />`,
 * with `[query]` for the address's query parameters. A row's own links to other pages use it.
 */
@Component({
  selector: 'app-icon-link',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule, RouterLink],
  template: `
    <a
      mat-icon-button
      [routerLink]="link()"
      [queryParams]="query()"
      [attr.aria-label]="label()"
      [matTooltip]="label()"
    >
      <mat-icon>{{ icon() }}</mat-icon>
    </a>
  `,
  // No box of its own: the link sits in the row's actions as if written there.
  host: { style: 'display: contents' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IconLink {
  readonly icon = input.required<string>();
  readonly link = input.required<readonly unknown[] | string>();
  readonly label = input.required<string>();
  readonly query = input<Params | null>(null);
}
