import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

import { formatMoney } from '../../../shared/money';
import type { ImportCountsJson, ImportJson } from '../../../shared/api/suppliers';
import { SeriesLengthPipe } from '../core/series-length-pipe';
import { describeDetected } from './import-words';

interface CountTile {
  key: keyof ImportCountsJson;
  label: string;
  icon: string;
  warn?: boolean;
}

const TILES: CountTile[] = [
  { key: 'rows', label: 'rows read', icon: 'table_rows' },
  { key: 'ok', label: 'rows usable', icon: 'check_circle' },
  { key: 'errors', label: 'rows with errors', icon: 'error', warn: true },
  { key: 'new', label: 'new items', icon: 'fiber_new' },
  { key: 'up', label: 'price up', icon: 'arrow_upward' },
  { key: 'down', label: 'price down', icon: 'arrow_downward' },
  { key: 'unchanged', label: 'unchanged', icon: 'drag_handle' },
  { key: 'missing', label: 'missing from this list', icon: 'remove_circle', warn: true },
  { key: 'unmapped', label: 'not mapped to our parts', icon: 'link_off', warn: true },
];

/** What a price list holds and what it would change: format, counts, price changes, errors, first rows. */
@Component({
  selector: 'app-import-preview',
  imports: [MatIconModule, SeriesLengthPipe],
  templateUrl: './import-preview.html',
  styleUrl: './import-preview.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportPreview {
  readonly preview = input.required<ImportJson>();

  protected readonly tiles = TILES;
  protected readonly detected = computed(() => describeDetected(this.preview().detected));

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
  }
}
