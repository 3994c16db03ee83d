import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';

import type {
  CounterMethod,
  CreditNoteJson,
  EstimateJson,
  EstimateLineJson,
  InvoiceJson,
  LabourOperationJson,
  LabourPer,
  PaymentJson,
  PaymentPurpose,
  PaymentsJson,
  ProposeFor,
  PublicJobJson,
} from '../../../shared/api/money';
import { HANDLES_OWN_401 } from '../core/http-context';

export interface LabourChanges {
  name?: string;
  per?: LabourPer;
  price?: string;
  active?: boolean;
  proposeFor?: ProposeFor;
}

export interface LineChanges {
  description?: string;
  quantity?: string;
  unitPrice?: string;
}

/**
 * The money side of a job: labour prices, the estimate and its approval, payments, the invoice,
 * and the customer's own page (read and answered without a session, by the token in the link).
 */
@Injectable({ providedIn: 'root' })
export class MoneyApi {
  private readonly http = inject(HttpClient);

  labour(): Observable<{ items: LabourOperationJson[] }> {
    return this.http.get<{ items: LabourOperationJson[] }>('/api/labour-operations');
  }

  addLabour(input: Required<Omit<LabourChanges, 'active'>> & { active?: boolean }) {
    return this.http.post<LabourOperationJson>('/api/labour-operations', input);
  }

  changeLabour(id: string, changes: LabourChanges): Observable<LabourOperationJson> {
    return this.http.patch<LabourOperationJson>(`/api/labour-operations/${id}`, changes);
  }

  estimate(jobId: string): Observable<EstimateJson> {
    return this.http.get<EstimateJson>(`/api/jobs/${jobId}/estimate`);
  }

  addLine(jobId: string, line: Required<LineChanges>): Observable<EstimateLineJson> {
    return this.http.post<EstimateLineJson>(`/api/jobs/${jobId}/estimate/lines`, line);
  }

  changeLine(jobId: string, lineId: string, changes: LineChanges): Observable<EstimateLineJson> {
    return this.http.patch<EstimateLineJson>(
      `/api/jobs/${jobId}/estimate/lines/${lineId}`,
      changes,
    );
  }

  removeLine(jobId: string, lineId: string): Observable<void> {
    return this.http.delete<void>(`/api/jobs/${jobId}/estimate/lines/${lineId}`);
  }

  addDiscount(jobId: string, amount: string, reason: string): Observable<EstimateLineJson> {
    return this.http.post<EstimateLineJson>(`/api/jobs/${jobId}/estimate/discount`, {
      amount,
      reason,
    });
  }

  send(jobId: string): Observable<{ state: 'sent' }> {
    return this.http.post<{ state: 'sent' }>(`/api/jobs/${jobId}/estimate/send`, {});
  }

  approveAtCounter(
    jobId: string,
    how: 'counter' | 'phone',
    note: string,
  ): Observable<{ state: 'approved' }> {
    const body = note ? { how, note } : { how };
    return this.http.post<{ state: 'approved' }>(`/api/jobs/${jobId}/estimate/approval`, body);
  }

  payments(jobId: string): Observable<PaymentsJson> {
    return this.http.get<PaymentsJson>(`/api/jobs/${jobId}/payments`);
  }

  requestPayment(jobId: string, purpose: PaymentPurpose, amount?: string) {
    const body = amount ? { purpose, amount } : { purpose };
    return this.http.post<PaymentJson>(`/api/jobs/${jobId}/payment-requests`, body);
  }

  recordPayment(jobId: string, method: CounterMethod, amount: string): Observable<PaymentJson> {
    return this.http.post<PaymentJson>(`/api/jobs/${jobId}/payments`, { method, amount });
  }

  refund(jobId: string, paymentId: string, reason: string): Observable<PaymentJson> {
    return this.http.post<PaymentJson>(`/api/jobs/${jobId}/payments/${paymentId}/refund`, {
      reason,
    });
  }

  /** A correction of the issued invoice: one amount off, with its reason. */
  creditNote(jobId: string, reason: string, amount: string): Observable<CreditNoteJson> {
    return this.http.post<CreditNoteJson>(`/api/jobs/${jobId}/invoice/credit-notes`, {
      reason,
      amount,
    });
  }

  invoice(jobId: string): Observable<InvoiceJson> {
    return this.http.get<InvoiceJson>(`/api/jobs/${jobId}/invoice`);
  }

  /** The customer's page: no session, so a 401 (never expected) is not a signed-out staff member. */
  publicJob(token: string): Observable<PublicJobJson> {
    return this.http.get<PublicJobJson>(`/api/public/jobs/${encodeURIComponent(token)}`, {
      context: new HttpContext().set(HANDLES_OWN_401, true),
    });
  }

  answer(token: string, answer: 'approve' | 'decline') {
    return this.http.post<{ state: 'approved' | 'declined' }>(
      `/api/public/jobs/${encodeURIComponent(token)}/${answer}`,
      {},
      { context: new HttpContext().set(HANDLES_OWN_401, true) },
    );
  }
}

/** Where the invoice's printable copy is; a plain link, so the browser opens the PDF itself. */
export function invoicePdfUrl(jobId: string): string {
  return `/api/jobs/${jobId}/invoice.pdf`;
}
