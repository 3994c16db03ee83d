// Payment routes: payment links (deposit or what is left) and payments at the counter, refunds, and
// the payment service's signed events. Everyone signed in reads a job's payments; staff and the
// owner ask for and take money. The webhook has no session and no XSRF token: its signature is
// the credential, checked on the raw body (app.ts keeps it raw).
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import { may } from '../../shared/access';
import { counterPaymentInput, paymentRequestInput, refundInput } from '../../shared/api/money';
import * as payments from './payment-service';
import * as refunds from './refund-service';
import { receiveEvent } from './webhook-service';

const idParams = z.object({ id: idField });
const paymentParams = z.object({ id: idField, paymentId: idField });

export function registerPaymentRoutes(router: Router): void {
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/payment-requests',
    access: may.takeMoney,
    params: idParams,
    body: paymentRequestInput,
    status: 201,
    handler: ({ params, body, user }) => payments.requestPayment(user.id, params.id, body),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/payments',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => payments.listPayments(params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/payments',
    access: may.takeMoney,
    params: idParams,
    body: counterPaymentInput,
    status: 201,
    handler: ({ params, body, user }) => payments.recordCounterPayment(user.id, params.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/payments/:paymentId/refund',
    access: may.takeMoney,
    params: paymentParams,
    body: refundInput,
    handler: ({ params, body, user }) =>
      refunds.refundPayment(user.id, params.id, params.paymentId, body),
  });
  route(router, {
    method: 'post',
    path: '/api/payments/webhook',
    access: 'public',
    handler: ({ req }) => receiveEvent(req.body, req.get('stripe-signature')),
  });
}
