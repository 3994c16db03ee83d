// A payment as the API answers it, and its amount in the payment service's units.
import Decimal from 'decimal.js';
import { currencyDecimals } from '../../shared/money';
import type { PaymentJson, PaymentPurpose } from '../../shared/api/money';
import { fixedMoney } from '../../shared/estimate-math';
import type { PaymentRow } from './payments-repository';

export const PURPOSE_WORDS: Record<PaymentPurpose, string> = {
  deposit: 'Deposit',
  balance: 'Payment of what is left',
};

export function paymentJson(p: PaymentRow): PaymentJson {
  return {
    id: p.id,
    purpose: p.purpose,
    method: p.method,
    amount: fixedMoney(p.amount, p.currency),
    state: p.state,
    url: p.state === 'open' ? p.url : null,
    createdAt: p.created_at.toISOString(),
    paidAt: p.paid_at ? p.paid_at.toISOString() : null,
    refundedAt: p.refunded_at ? p.refunded_at.toISOString() : null,
    refundReason: p.refund_reason,
  };
}

/** The amount in the currency's smallest unit (cents), as the payment service counts it; null when it has more decimals than the currency uses. */
export function minorUnits(amount: string, currency: string): number | null {
  const minor = new Decimal(amount).times(new Decimal(10).pow(currencyDecimals(currency)));
  return minor.isInteger() ? minor.toNumber() : null;
}
