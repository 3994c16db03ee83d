import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { normalizeGtin } from '../../../shared/gtin';
import { parseLength } from '../../../shared/lengths';
import type { OrderJson, OrderLineJson, OrderReceiptJson } from '../../../shared/api/purchasing';
import { apiFieldErrors, apiUnplacedMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { lengthText, otherUnitHint } from '../ui/length-input';
import { loadById } from '../ui/load';
import { PurchasingApi } from './purchasing-api';
import { FormAlert } from '../ui/form-alert';

interface LineEntry {
  quantity: number;
  /** One measured skirt per piston, as typed; empty = still to measure. */
  skirts: string[];
}

/**
 * Receiving a delivery against an order at the bench: scan a box's GTIN to find its line, count
 * what came, and type each piston's measured skirt. Arriving pistons go to the jobs waiting for them.
 */
@Component({
  selector: 'app-receive-order',
  imports: [
    FormAlert,
    FormsModule,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './receive-order.html',
  styleUrl: './receive-order.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReceiveOrder {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  readonly id = input.required<string>();
  /** A line to start with (?lineId=…), e.g. from a scan on the receiving bench. */
  readonly lineId = input<string>();

  protected readonly unit = this.session.unit;
  protected readonly loaded = loadById(this.id, (id) => this.api.order(id));
  protected readonly order = this.loaded.value;
  /** What is counted in on each line: nothing yet for each order as it arrives. */
  protected readonly entries = linkedSignal<Record<string, LineEntry>>(() =>
    Object.fromEntries((this.order()?.lines ?? []).map((l) => [l.id, { quantity: 0, skirts: [] }])),
  );
  protected readonly highlighted = signal<string | null>(null);
  protected readonly scanMessage = signal('');
  protected readonly saving = signal(false);
  protected readonly error = signal('');
  protected readonly fieldErrors = signal<Record<string, string>>({});
  protected readonly result = signal<OrderReceiptJson | null>(null);
  protected scanText = '';

  protected readonly openLines = computed(() =>
    (this.order()?.lines ?? []).filter((l) => l.open > 0),
  );

  constructor() {
    // The line to start with is picked once, when the order first arrives (not after a receipt).
    let started = false;
    effect(() => {
      const order = this.order();
      const start = this.lineId();
      if (!order || started) return;
      started = true;
      if (start) untracked(() => this.pick(order.lines.find((l) => l.id === start) ?? null));
    });
  }

  protected entry(line: OrderLineJson): LineEntry {
    return this.entries()[line.id] ?? { quantity: 0, skirts: [] };
  }

  protected setQuantity(line: OrderLineJson, value: number | string): void {
    const quantity = Math.max(0, Math.min(line.open, Math.floor(Number(value) || 0)));
    const skirts = [...this.entry(line).skirts];
    skirts.length = line.partKind === 'piston' ? quantity : 0;
    this.entries.update((all) => ({
      ...all,
      [line.id]: { quantity, skirts: Array.from(skirts, (s) => s ?? '') },
    }));
  }

  protected setSkirt(line: OrderLineJson, i: number, text: string): void {
    const skirts = [...this.entry(line).skirts];
    skirts[i] = text;
    this.entries.update((all) => ({ ...all, [line.id]: { ...this.entry(line), skirts } }));
  }

  protected skirtHint(text: string): string {
    return otherUnitHint(text, this.unit());
  }

  protected skirtProblem(text: string): string {
    if (!text.trim()) return '';
    const parsed = parseLength(lengthText(text, this.unit()));
    return parsed.ok ? '' : parsed.message;
  }

  private pick(line: OrderLineJson | null): void {
    if (!line) return;
    this.highlighted.set(line.id);
    if (this.entry(line).quantity === 0) this.setQuantity(line, 1);
  }

  /** A scanned GTIN finds its line on this order and counts one more box of it. */
  protected scan(): void {
    const code = normalizeGtin(this.scanText);
    const order = this.order();
    if (!code || !order) {
      this.scanMessage.set('That is not a valid GTIN: check the digits under the barcode.');
      return;
    }
    const line = order.lines.find(
      (l) => l.open > 0 && l.gtins.some((g) => normalizeGtin(g) === code),
    );
    if (!line) {
      this.scanMessage.set(`No open line of ${order.number} has the GTIN ${this.scanText.trim()}.`);
      return;
    }
    this.scanMessage.set(`Line ${line.lineNo}: ${line.sku}.`);
    this.highlighted.set(line.id);
    this.setQuantity(line, Math.min(line.open, this.entry(line).quantity + 1));
    this.scanText = '';
  }

  protected receive(order: OrderJson): void {
    const lines = order.lines
      .filter((l) => this.entry(l).quantity > 0)
      .map((l) => ({
        lineId: l.id,
        quantity: this.entry(l).quantity,
        ...(l.partKind === 'piston'
          ? {
              units: this.entry(l).skirts.map((s) =>
                s.trim() ? { skirt: lengthText(s, this.unit()) } : {},
              ),
            }
          : {}),
      }));
    if (lines.length === 0) {
      this.error.set('Enter how many came for at least one line.');
      return;
    }
    this.saving.set(true);
    this.error.set('');
    this.fieldErrors.set({});
    this.api.receive(order.id, { lines }).subscribe({
      next: (result) => {
        this.saving.set(false);
        this.result.set(result);
        this.loaded.set(result.order);
        void this.notifier.success(
          `Received ${result.units.length || 'the'} item${result.units.length === 1 ? '' : 's'} against ${order.number}.`,
        );
      },
      error: (e: unknown) => {
        this.saving.set(false);
        // "lines.1.quantity" counts the lines sent, not the lines shown: key each by its line's id.
        const sent = lines.map((l) => l.lineId);
        const at = (field: string): string | null => {
          const m = /^lines\.(\d+)\.(quantity|units\.\d+\.skirt)$/.exec(field);
          const id = m ? sent[Number(m[1])] : undefined;
          return m && id ? `${id}.${m[2]}` : null;
        };
        const fields: Record<string, string> = {};
        for (const [field, message] of Object.entries(apiFieldErrors(e))) {
          const key = at(field);
          if (key) fields[key] = message;
        }
        this.fieldErrors.set(fields);
        const rest = apiUnplacedMessage(e, (field) => at(field) !== null);
        this.error.set(rest === 'Check the marked fields.' ? '' : rest);
      },
    });
  }
}
