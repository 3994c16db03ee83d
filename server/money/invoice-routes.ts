// Invoice routes: every signed-in role reads the job's invoice and prints it; staff and the owner
// correct one with a credit note (an issued invoice itself never changes).
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import { creditNoteInput } from '../../shared/api/money';
import * as invoices from './invoice-service';
import { may } from '../../shared/access';

const idParams = z.object({ id: idField });

export function registerInvoiceRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/invoice',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => invoices.getInvoice(params.id),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/invoice.pdf',
    access: 'signed-in',
    params: idParams,
    handler: async ({ params, res }) => {
      const pdf = await invoices.getInvoicePdf(params.id);
      res.setHeader('Content-Type', 'application/pdf');
      res.setHeader('Cache-Control', 'private, no-store');
      res.setHeader('Content-Disposition', `inline; filename="invoice-${pdf.number}.pdf"`);
      res.status(200).end(pdf.data);
      return undefined;
    },
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/invoice/credit-notes',
    access: may.takeMoney,
    params: idParams,
    body: creditNoteInput,
    status: 201,
    handler: ({ params, body, user }) => invoices.issueCreditNote(user.id, params.id, body),
  });
}
