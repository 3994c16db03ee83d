import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

import { IconLink } from '../ui/icon-link';

/**
 * A part's two buying links at the end of a row, named for the part: who has it (the sourcing
 * page, asked for `quantity` when given) and its reorder rule. The reorder list and the stock
 * alerts both end their rows with them.
 */
@Component({
  selector: 'app-part-buying-links',
  imports: [IconLink],
  template: `
    <app-icon-link
      icon="travel_explore"
      [link]="['/purchasing/sourcing']"
      [query]="sourcingQuery()"
      [label]="'Who has ' + sku()"
    />
    <app-icon-link
      icon="tune"
      [link]="['/purchasing/reorder', partId()]"
      [label]="'Reorder rule of ' + sku()"
    />
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
