import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import type { OrderJson, OrderLineJson, WaitCandidateJson } from '../../../shared/api/purchasing';
import { apiErrorMessage, apiFieldErrors, apiUnplacedMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { loadById } from '../ui/load';
import { PurchasingApi } from './purchasing-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { FormAlert } from '../ui/form-alert';

interface LineEdit {
  quantity: number;
  unitPrice: string;
}

/**
 * One purchase order: its lines, what has come in, the jobs waiting on each line; a draft can be
 * changed and sent, an open order called off or received against.
 */
@Component({
  selector: 'app-order-page',
  imports: [
    FormAlert,
    ShopDatePipe,
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './order-page.html',
  styleUrl: './order-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OrderPage {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  readonly id = input.required<string>();

  protected readonly loaded = loadById(this.id, (id) => this.api.order(id));
  protected readonly order = this.loaded.value;
  protected readonly busy = signal(false);
  /** What is typed into each line, from each order as it arrives. */
  protected readonly edits = linkedSignal<Record<string, LineEdit>>(() =>
    Object.fromEntries(
      (this.order()?.lines ?? []).map((l) => [
        l.id,
        { quantity: l.quantity, unitPrice: l.unitPrice ?? '' },
      ]),
    ),
  );
  protected readonly candidates = signal<Record<string, WaitCandidateJson[]>>({});

  protected readonly canOrder = computed(() => this.session.may('buy'));
  protected readonly canReceive = computed(() => this.session.may('receiveStock'));
  protected readonly canWait = computed(() => this.session.may('keepOrderWaits'));
  protected readonly drafting = computed(() => this.order()?.state === 'drafting');
  protected readonly open = computed(() =>
    ['sent_out', 'partly_in'].includes(this.order()?.state ?? ''),
  );
  protected readonly closed = computed(() =>
    ['all_in', 'called_off'].includes(this.order()?.state ?? ''),
  );

  protected edit(line: OrderLineJson): LineEdit {
    return this.edits()[line.id] ?? { quantity: line.quantity, unitPrice: line.unitPrice ?? '' };
  }

  protected setEdit(line: OrderLineJson, change: Partial<LineEdit>): void {
    this.edits.update((all) => ({ ...all, [line.id]: { ...this.edit(line), ...change } }));
  }

  private act(what: Promise<unknown> | null, done: string): void {
    if (!what) return;
    this.busy.set(true);
    what.then(
      () => {
        this.busy.set(false);
        void this.notifier.success(done);
        this.loaded.reload();
      },
      (e: unknown) => {
        this.busy.set(false);
        void this.notifier.error(apiErrorMessage(e));
        this.loaded.reload();
      },
    );
  }

  private promise<T>(o: import('rxjs').Observable<T>): Promise<T> {
    return new Promise<T>((resolve, reject) => o.subscribe({ next: resolve, error: reject }));
  }

  protected saveLines(order: OrderJson): void {
    const lines = order.lines.map((l) => ({
      partId: l.partId,
      quantity: Number(this.edit(l).quantity),
      unitPrice: String(this.edit(l).unitPrice).trim(),
    }));
    if (this.busy()) return;
    this.busy.set(true);
    this.lineErrors.set({});
    this.linesProblem.set('');
    this.api.updateOrder(order.id, { lines }).subscribe({
      next: () => {
        this.busy.set(false);
        void this.notifier.success('Changes saved.');
        this.loaded.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        // "lines.0.quantity" is the first line's quantity: said under that field, in words, once.
        const at = (field: string): string | null => {
          const m = /^lines\.(\d+)\.(quantity|unitPrice)$/.exec(field);
          const line = m ? order.lines[Number(m[1])] : undefined;
          return m && line ? `${line.id}.${m[2]}` : null;
        };
        const errors: Record<string, string> = {};
        for (const [field, message] of Object.entries(apiFieldErrors(e))) {
          const key = at(field);
          if (key) errors[key] = message;
        }
        this.lineErrors.set(errors);
        const rest = apiUnplacedMessage(e, (field) => at(field) !== null);
        this.linesProblem.set(rest === 'Check the marked fields.' ? '' : rest);
      },
    });
  }

  /** The server's reasons under the line field each is about (keyed "lineId.quantity"). */
  protected readonly lineErrors = signal<Record<string, string>>({});
  protected readonly linesProblem = signal('');

  protected send(order: OrderJson): void {
    this.act(
      this.promise(this.api.send(order.id)),
      `${order.number} is on its way to ${order.supplierName}.`,
    );
  }

  protected cancel(order: OrderJson): void {
    this.act(this.promise(this.api.cancel(order.id)), `${order.number} is called off.`);
  }

  protected findJobs(line: OrderLineJson): void {
    this.api.waitCandidates(line.id).subscribe({
      next: (r) => this.candidates.update((all) => ({ ...all, [line.id]: r.items })),
      error: (e: unknown) => void this.notifier.error(apiErrorMessage(e)),
    });
  }

  protected wait(line: OrderLineJson, c: WaitCandidateJson): void {
    // The list is asked again when wanted: the job just set no longer belongs in it.
    this.candidates.update((all) => {
      const rest = { ...all };
      delete rest[line.id];
      return rest;
    });
    this.act(
      this.promise(this.api.addWait({ jobId: c.jobId, cylinder: c.cylinder, lineId: line.id })),
      `Job ${c.jobNumber}, cylinder ${c.cylinder} now waits for this line.`,
    );
  }

  protected stopWaiting(waitId: string, jobNumber: string): void {
    this.act(
      this.promise(this.api.cancelWait(waitId)),
      `Job ${jobNumber} no longer waits on this order.`,
    );
  }
}
