import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of } from 'rxjs';

import type { OpenLineJson, OrderListItemJson } from '../../../shared/purchasing-api';
import { apiErrorMessage } from '../core/api-error';
import { PurchasingApi } from './purchasing-api';

/** The receiving bench: scan a box to find which open order it belongs to, or pick the order. */
@Component({
  selector: 'app-receiving-bench',
  imports: [
    DatePipe,
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './receiving-bench.html',
  styleUrl: './receiving-bench.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReceivingBench {
  private readonly api = inject(PurchasingApi);
  private readonly router = inject(Router);

  protected readonly columns = ['number', 'supplier', 'expectedOn', 'lines', 'actions'];
  protected readonly openOrders = toSignal(
    this.api.orders({ state: 'open', sort: 'expectedOn', dir: 'asc', page: 1, pageSize: 100 }).pipe(
      map((p): { ok: true; items: OrderListItemJson[] } => ({ ok: true, items: p.items })),
      catchError((e: unknown) => of({ ok: false as const, message: apiErrorMessage(e) })),
    ),
  );
  protected readonly found = signal<OpenLineJson[] | null>(null);
  protected readonly scanError = signal('');
  protected code = '';

  protected scan(): void {
    this.scanError.set('');
    this.api.openLines(this.code.trim()).subscribe({
      next: (r) => {
        this.found.set(r.items);
        if (r.items.length === 1) {
          const hit = r.items[0];
          void this.router.navigate(['/purchasing/orders', hit.orderId, 'receive'], {
            queryParams: { lineId: hit.line.id },
          });
        }
      },
      error: (e: unknown) => {
        this.found.set(null);
        this.scanError.set(apiErrorMessage(e));
      },
    });
  }
}
