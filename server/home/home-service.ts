// The home page's summary: for each section the signed-in role starts its day with, how many there
// are and the first few. Waiting for parts, alerts and orders come from their own features, so the
// home page counts exactly what those pages list.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { listAlerts } from '../alerts/alerts-service';
import { listJobs, shopToday } from '../jobs/jobs-service';
import { listOrders } from '../purchasing/orders-service';
import {
  HOME_LIST_LENGTH,
  HOME_SECTIONS_BY_ROLE,
  type HomeJobJson,
  type HomeJson,
} from '../../shared/api/home';
import { OPEN_STATES, type JobListItemJson } from '../../shared/api/jobs';
import type { Role } from '../../shared/session-types';
import * as repo from './home-repository';

function jobJson(r: repo.HomeJobRow): HomeJobJson {
  return {
    id: r.id,
    number: r.number,
    state: r.state,
    customerName: r.customer_name,
    familyCode: r.family_code,
    dueDate: r.due_date,
    overdue: r.overdue,
  };
}

function listedJobJson(j: JobListItemJson): HomeJobJson {
  return {
    id: j.id,
    number: j.number,
    state: j.state,
    customerName: j.customerName,
    familyCode: j.family.code,
    dueDate: j.dueDate,
    overdue: j.overdue,
  };
}

export async function homeFor(role: Role, k: Knex = db): Promise<HomeJson> {
  const today = await shopToday(k);
  const wanted = new Set(HOME_SECTIONS_BY_ROLE[role]);
  const n = HOME_LIST_LENGTH;
  const home: HomeJson = { today };

  if (wanted.has('dueToday')) {
    const { rows, total } = await repo.jobsDueBy(today, n, k);
    home.dueToday = { total, items: rows.map(jobJson) };
  }
  if (wanted.has('waitingForParts')) {
    const found = await listJobs(
      { states: [...OPEN_STATES], waiting: true, sort: 'due', page: 1, pageSize: n },
      k,
    );
    home.waitingForParts = { total: found.total, items: found.items.map(listedJobJson) };
  }
  if (wanted.has('waitingForApproval')) {
    const { rows, total } = await repo.jobsAwaitingApproval(today, n, k);
    home.waitingForApproval = { total, items: rows.map(jobJson) };
  }
  if (wanted.has('alerts')) {
    const found = await listAlerts({ state: 'open', page: 1, pageSize: n }, k);
    home.alerts = {
      total: found.total,
      items: found.items.map((a) => ({
        id: a.id,
        partId: a.partId,
        sku: a.sku,
        description: a.description,
        free: a.free,
        reorderPoint: a.reorderPoint,
        raisedAt: a.raisedAt,
      })),
    };
  }
  if (wanted.has('ordersArriving')) {
    const found = await listOrders(
      { state: 'open', sort: 'expectedOn', dir: 'asc', page: 1, pageSize: n },
      k,
    );
    home.ordersArriving = {
      total: found.total,
      items: found.items.map((o) => ({
        id: o.id,
        number: o.number,
        supplierName: o.supplierName,
        state: o.state,
        expectedOn: o.expectedOn,
        late: o.expectedOn !== null && o.expectedOn < today,
        outstanding: o.quantity - o.received,
      })),
    };
  }
  return home;
}
