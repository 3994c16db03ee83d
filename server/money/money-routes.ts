// Money routes: the labour price list (the owner's), the job's estimate and the customer's approval
// taken by staff. Everyone signed in reads; staff and the owner price and take approvals.
import type { Router } from 'express';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField } from '../../shared/api/common';
import {
  approvalInput,
  discountInput,
  labourInput,
  labourPatch,
  lineInput,
  linePatch,
} from '../../shared/api/money';
import * as labour from './labour-service';
import * as estimates from './estimate-service';
import * as approvals from './approval-service';
import { may } from '../../shared/access';

const idParams = z.object({ id: idField });
const lineParams = z.object({ id: idField, lineId: idField });

export function registerMoneyRoutes(router: Router): void {
  route(router, {
    method: 'get',
    path: '/api/labour-operations',
    access: 'signed-in',
    handler: () => labour.listLabour(),
  });
  route(router, {
    method: 'post',
    path: '/api/labour-operations',
    access: may.setRates,
    body: labourInput,
    status: 201,
    handler: ({ body, user }) => labour.createLabour(user.id, body),
  });
  route(router, {
    method: 'patch',
    path: '/api/labour-operations/:id',
    access: may.setRates,
    params: idParams,
    body: labourPatch,
    handler: ({ params, body, user }) => labour.patchLabour(user.id, params.id, body),
  });

  route(router, {
    method: 'get',
    path: '/api/jobs/:id/estimate',
    access: 'signed-in',
    params: idParams,
    handler: ({ params }) => estimates.getEstimate(params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/estimate/lines',
    access: may.takeMoney,
    params: idParams,
    body: lineInput,
    status: 201,
    handler: ({ params, body, user }) => estimates.addLine(user.id, params.id, body),
  });
  route(router, {
    method: 'patch',
    path: '/api/jobs/:id/estimate/lines/:lineId',
    access: may.takeMoney,
    params: lineParams,
    body: linePatch,
    handler: ({ params, body, user }) =>
      estimates.patchLine(user.id, params.id, params.lineId, body),
  });
  route(router, {
    method: 'delete',
    path: '/api/jobs/:id/estimate/lines/:lineId',
    access: may.takeMoney,
    params: lineParams,
    handler: ({ params, user }) => estimates.removeLine(user.id, params.id, params.lineId),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/estimate/discount',
    access: may.takeMoney,
    params: idParams,
    body: discountInput,
    status: 201,
    handler: ({ params, body, user }) => estimates.addDiscount(user.id, params.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/estimate/send',
    access: may.takeMoney,
    params: idParams,
    body: z.strictObject({}),
    handler: ({ params, user }) => approvals.sendEstimate(user.id, params.id),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/estimate/approval',
    access: may.takeMoney,
    params: idParams,
    body: approvalInput,
    handler: ({ params, body, user }) => approvals.approveAtCounter(user.id, params.id, body),
  });
}
