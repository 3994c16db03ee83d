import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';

/**
 * A part's two buying links at the end of a row, named for the part: who has it (the sourcing
 * page, asked for `quantity` when given) and its reorder rule. The reorder list and the stock
 * alerts both end their rows with them.
 */
@Component({
  selector: 'app-part-buying-links',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule, RouterLink],
  template: `
    <a
      mat-icon-button
      [routerLink]="['/purchasing/sourcing']"
      [queryParams]="sourcingQuery()"
      [attr.aria-label]="'Who has ' + sku()"
      [matTooltip]="'Who has ' + sku()"
    >
      <mat-icon>travel_explore</mat-icon>
    </a>
    <a
      mat-icon-button
      [routerLink]="['/purchasing/reorder', partId()]"
      [attr.aria-label]="'Reorder rule of ' + sku()"
      [matTooltip]="'Reorder rule of ' + sku()"
    >
      <mat-icon>tune</mat-icon>
    </a>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PartBuyingLinks {
  readonly partId = input.required<string>();
  readonly sku = input.required<string>();
  /** How many to ask the suppliers for; left out, the sourcing page asks its own default. */
  readonly quantity = input<number | null>(null);

  protected readonly sourcingQuery = computed(() => {
    const quantity = this.quantity();
    return quantity === null ? { partId: this.partId() } : { partId: this.partId(), quantity };
  });
}
