import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { debounce, map, timer } from 'rxjs';

import type { PartJson } from '../../../shared/api/catalog';
import { StockApi } from './stock-api';
import { loadEach } from '../ui/load';
import { OfferSearch } from '../ui/offer-search';

type Found = { parts: PartJson[]; message: string; text: string; scan: boolean };

/**
 * Finds a part by number, words, GTIN or piston label. A scanner types digits and Enter: a scan
 * that finds exactly one part picks it at once.
 */
@Component({
  selector: 'app-part-picker',
  imports: [OfferSearch],
  template: `
    <app-offer-search
      [label]="label()"
      icon="barcode_scanner"
      hint="Part number or words, or scan the box's barcode"
      [text]="text()"
      [items]="found().parts"
      [problem]="found().message"
      (typed)="onType($event)"
      (entered)="onEnter($event)"
      (chosen)="choose($event)"
    >
      <ng-template let-p>
        <strong>{{ p.sku }}</strong> — {{ p.description }}
        @if (p.stepLabel) {
          · {{ p.stepLabel }}
        }
      </ng-template>
    </app-offer-search>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PartPicker {
  private readonly api = inject(StockApi);

  readonly label = input('Part');
  /** Kits are never counted, so receiving and counting leave them out. */
  readonly countedOnly = input(true);
  readonly picked = output<PartJson>();

  protected readonly text = signal('');
  private readonly search = signal({ text: '', scan: false });

  /** What to look up: at once after a scanner's Enter, else once typing pauses. */
  private readonly asked = toSignal(
    toObservable(this.search).pipe(debounce((s) => timer(s.scan ? 0 : 200))),
    { initialValue: { text: '', scan: false } },
  );
  private readonly results = loadEach(
    () => {
      const asked = this.asked();
      return asked.text.trim().length >= 2 ? asked : null;
    },
    (asked) =>
      this.api.findParts(asked.text.trim()).pipe(
        map((page): Found => {
          const parts = this.countedOnly()
            ? page.items.filter((p) => p.kind !== 'kit')
            : page.items;
          const message = parts.length === 0 ? `Nothing found for “${asked.text.trim()}”.` : '';
          return { ...asked, parts, message };
        }),
      ),
  );
  protected readonly found = computed((): Found => {
    const { text, scan } = this.asked();
    const error = this.results.error();
    if (error) return { parts: [], message: error, text, scan };
    return this.results.value() ?? { parts: [], message: '', text, scan };
  });

  constructor() {
    // A scan that finds one part picks it: no mouse needed at the receiving bench.
    toObservable(this.found).subscribe((f) => {
      if (f.scan && f.parts.length === 1 && f.text === this.text()) this.choose(f.parts[0]);
    });
  }

  protected onType(value: string): void {
    this.text.set(value);
    this.search.set({ text: value, scan: false });
  }

  protected onEnter(event: Event): void {
    event.preventDefault();
    const value = this.text();
    const f = this.found();
    if (f.text === value && f.parts.length === 1) {
      this.choose(f.parts[0]);
      return;
    }
    // Enter searches at once, and a single match is picked (what a scanner's Enter expects).
    this.search.set({ text: value, scan: true });
  }

  protected choose(part: PartJson): void {
    this.text.set('');
    this.search.set({ text: '', scan: false });
    this.picked.emit(part);
  }
}
