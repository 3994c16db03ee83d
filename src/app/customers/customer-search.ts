import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { map } from 'rxjs';

import type { CustomerListItemJson } from '../../../shared/api/customers';
import { CustomersApi } from './customers-api';
import { debounced, loadEach } from '../ui/load';
import { OfferSearch } from '../ui/offer-search';

type Found = { items: CustomerListItemJson[]; message: string };

/** Fewest characters searched: two keystrokes find a returning customer. */
export const SEARCH_MIN = 2;

/**
 * Finds a customer as you type: by name, phone (digits alone are enough) or e-mail. The server
 * puts names that start with the text and recent customers first.
 */
@Component({
  selector: 'app-customer-search',
  imports: [OfferSearch],
  template: `
    <app-offer-search
      [label]="label()"
      icon="person_search"
      hint="Name, phone or e-mail; two letters are enough"
      [text]="text()"
      [items]="shown().items"
      [problem]="shown().message"
      (typed)="onType($event)"
      (chosen)="choose($event)"
    >
      <ng-template let-c>
        <strong>{{ c.name }}</strong>
        @if (c.phone) {
          · {{ c.phone }}
        }
        @if (c.email) {
          · {{ c.email }}
        }
      </ng-template>
    </app-offer-search>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerSearch {
  private readonly api = inject(CustomersApi);

  readonly label = input('Find the customer');
  /** Left out of the answers (merging a customer into itself makes no sense). */
  readonly excludeId = input<string | null>(null);
  readonly picked = output<CustomerListItemJson>();

  protected readonly text = signal('');

  private readonly q = debounced(this.text, 150);
  private readonly results = loadEach(
    () => (this.q().length >= SEARCH_MIN ? this.q() : null),
    // The answer keeps the text it is for, so its "nothing found" names what was searched.
    (q) => this.api.search(q).pipe(map((page) => ({ items: page.items, q }))),
  );
  private readonly found = computed((): Found => {
    const error = this.results.error();
    const answer = this.results.value();
    if (error || !answer) return { items: [], message: error };
    const { items, q } = answer;
    return { items, message: items.length === 0 ? `No customer found for “${q}”.` : '' };
  });

  protected shown(): Found {
    const f = this.found();
    const skip = this.excludeId();
    if (!skip) return f;
    const items = f.items.filter((c) => c.id !== skip);
    return {
      ...f,
      items,
      message: f.items.length > 0 && items.length === 0 ? 'Only this customer matches.' : f.message,
    };
  }

  protected onType(value: string): void {
    this.text.set(value);
  }

  protected choose(customer: CustomerListItemJson): void {
    this.text.set('');
    this.picked.emit(customer);
  }
}
