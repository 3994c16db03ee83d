// Walks every route registered on the Express app with every role and signed out, against the
// table below. A route added without an access declaration, or missing from this table, fails.
import express, { type Router } from 'express';
import { createApp } from '../../server/app';
import { assertEveryRouteDeclared, type Access } from '../../server/http/route';
import { Client, closeTestApp, signedIn } from '../support/api';
import { ROLES, type Role } from '../../shared/session-types';

const ALL: Access = 'signed-in';
const OWNER: Access = ['owner'];

/** What each route must allow. Keep it in step with the routes: this is the access contract. */
const EXPECTED: Record<string, Access> = {
  'GET /api/health': 'public',
  'GET /api/openapi.json': 'public',
  'POST /api/session': 'public',
  'GET /api/session': 'public',
  'DELETE /api/session': 'public',
  'GET /api/users': OWNER,
  'POST /api/users': OWNER,
  'PATCH /api/users/:id': OWNER,
  // The audit trail of every change, for the owner.
  'GET /api/audit': OWNER,
  'PATCH /api/account': ALL,
  'POST /api/account/password': ALL,
  'GET /api/settings': ALL,
  'GET /api/home': ALL,
  'PATCH /api/settings': OWNER,
  // Catalog and stock: everyone reads; owner and buyer keep the catalog; receiving, moves and bins
  // are staff work too; anyone at the bench may measure a piston; adjustments stay with owner and buyer.
  'GET /api/step-series': ALL,
  'POST /api/step-series': ['owner', 'buyer'],
  'GET /api/engine-families': ALL,
  'POST /api/engine-families': ['owner', 'buyer'],
  'GET /api/engine-families/:id': ALL,
  'PATCH /api/engine-families/:id': ['owner', 'buyer'],
  'GET /api/engine-families/:id/ladder': ALL,
  'GET /api/engine-families/:id/ladder/steps/:stepId/units': ALL,
  'GET /api/exposure': ALL,
  'GET /api/parts': ALL,
  'POST /api/parts': ['owner', 'buyer'],
  'GET /api/parts/:id': ALL,
  'PATCH /api/parts/:id': ['owner', 'buyer'],
  'GET /api/bins': ALL,
  'POST /api/bins': ['owner', 'buyer', 'staff'],
  'POST /api/stock/receipts': ['owner', 'buyer', 'staff'],
  'POST /api/stock/adjustments': ['owner', 'buyer'],
  'POST /api/stock/moves': ['owner', 'buyer', 'staff'],
  'GET /api/stock/units': ALL,
  'GET /api/stock/units/by-label/:label': ALL,
  'GET /api/stock/units/:id': ALL,
  'POST /api/stock/units/:id/scrap': ['owner', 'buyer', 'staff'],
  'POST /api/stock/units/:id/measure': ['owner', 'buyer', 'staff', 'machinist'],
  'GET /api/stock/ledger': ALL,
  // Jobs: intake at the counter and in the workshop; machine work (readings, holds, cuts, the bore
  // sheet) for machinists and the owner; everyone signed in reads.
  'POST /api/jobs': ['owner', 'machinist', 'staff'],
  'GET /api/jobs': ALL,
  'GET /api/jobs/:id': ALL,
  'PATCH /api/jobs/:id': ['owner', 'machinist', 'staff'],
  'POST /api/jobs/:id/notes': ['owner', 'machinist', 'staff'],
  'POST /api/jobs/:id/collect': ['owner', 'machinist', 'staff'],
  'POST /api/jobs/:id/cancel': ['owner', 'machinist', 'staff'],
  'PUT /api/jobs/:id/cylinders/:n/readings': ['owner', 'machinist'],
  'PUT /api/jobs/:id/cylinders/:n/passes-done': ['owner', 'machinist'],
  'PATCH /api/jobs/:id/cylinders/:n': ['owner', 'machinist'],
  'GET /api/jobs/:id/cylinders/:n/recommendation': ALL,
  'GET /api/jobs/:id/cylinders/:n/proposal': ['owner', 'machinist'],
  'GET /api/jobs/:id/cylinders/:n/bore-sheet': ['owner', 'machinist'],
  'POST /api/jobs/:id/cylinders/:n/cut': ['owner', 'machinist'],
  'POST /api/jobs/:id/cylinders/:n/cut/undo': ['owner', 'machinist'],
  'POST /api/jobs/:id/holds': ['owner', 'machinist'],
  'DELETE /api/holds/:id': ['owner', 'machinist'],
  'POST /api/holds/:id/move': ['owner', 'machinist'],
  'POST /api/holds/sweep': OWNER,
  'POST /api/jobs/:id/photos': ['owner', 'machinist', 'staff'],
  'GET /api/jobs/:id/photos/:photoId': ALL,
  'GET /api/jobs/:id/photos/:photoId/thumbnail': ALL,
  // Customers and their cylinders: everyone signed in reads (an export is a read); the counter and
  // the workshop create and edit; merging two records and erasing one are the owner's.
  'GET /api/customers': ALL,
  'POST /api/customers': ['owner', 'machinist', 'staff'],
  'GET /api/customers/:id': ALL,
  'PATCH /api/customers/:id': ['owner', 'machinist', 'staff'],
  'POST /api/customers/:id/merge': OWNER,
  'GET /api/customers/:id/export': ALL,
  'POST /api/customers/:id/erase': OWNER,
  'GET /api/customers/:id/cylinders': ALL,
  'POST /api/customers/:id/cylinders': ['owner', 'machinist', 'staff'],
  'GET /api/cylinders': ALL,
  'GET /api/cylinders/:id': ALL,
  // Insights: the owner sees everything; the buyer the stock side. Each table also as CSV.
  'GET /api/insights/sales': OWNER,
  'GET /api/insights/cylinders-near-last-step': OWNER,
  'GET /api/insights/cylinders-near-last-step.csv': OWNER,
  'GET /api/insights/sales.csv': OWNER,
  'GET /api/insights/sales/monthly': OWNER,
  'GET /api/insights/sales/monthly.csv': OWNER,
  'GET /api/insights/top-sellers': OWNER,
  'GET /api/insights/top-sellers.csv': OWNER,
  'GET /api/insights/stock-value': ['owner', 'buyer'],
  'GET /api/insights/stock-value.csv': ['owner', 'buyer'],
  'GET /api/insights/dead-stock': ['owner', 'buyer'],
  'GET /api/insights/dead-stock.csv': ['owner', 'buyer'],
  'GET /api/insights/abc': ['owner', 'buyer'],
  'GET /api/insights/abc.csv': ['owner', 'buyer'],
  'GET /api/insights/exposure': ['owner', 'buyer'],
  'GET /api/insights/exposure.csv': ['owner', 'buyer'],
  'GET /api/insights/supplier-reliability': ['owner', 'buyer'],
  'GET /api/insights/supplier-reliability.csv': ['owner', 'buyer'],
  // Suppliers: buyer and owner keep them and map their items; staff, who bring price lists in, read.
  // Price-list imports: staff, buyer, owner. Exports: the ladder for everyone, the rest for the counter.
  'GET /api/suppliers': ['owner', 'buyer', 'staff'],
  'POST /api/suppliers': ['owner', 'buyer'],
  'GET /api/suppliers/:id': ['owner', 'buyer', 'staff'],
  'PATCH /api/suppliers/:id': ['owner', 'buyer'],
  'GET /api/suppliers/:id/items': ['owner', 'buyer', 'staff'],
  'GET /api/suppliers/:id/items/:itemId/prices': ['owner', 'buyer', 'staff'],
  'GET /api/supplier-items/unmapped': ['owner', 'buyer', 'staff'],
  'PATCH /api/supplier-items/:id': ['owner', 'buyer'],
  'POST /api/suppliers/:id/price-lists': ['owner', 'buyer', 'staff'],
  'POST /api/price-list-imports/:id/commit': ['owner', 'buyer', 'staff'],
  'GET /api/price-list-imports': ['owner', 'buyer', 'staff'],
  'GET /api/price-list-imports/progress/:token': ['owner', 'buyer', 'staff'],
  'GET /api/price-list-imports/:id': ['owner', 'buyer', 'staff'],
  'GET /api/exports/stock.csv': ['owner', 'buyer', 'staff'],
  'GET /api/exports/families/:id/ladder.csv': ALL,
  'GET /api/exports/price-comparison.csv': ['owner', 'buyer', 'staff'],
  // Mail: the local mailbox (demo and tests) is the owner's.
  'GET /api/mailbox': OWNER,
  // Alerts and purchasing: buyer and owner reorder, source and order; staff read orders and receive
  // against them; everyone sees what is on order; machinists may set a cylinder to wait for a piston
  // on order; the owner keeps rates.
  'GET /api/alerts': ['owner', 'buyer'],
  'GET /api/alerts/mail-mode': ['owner', 'buyer'],
  'POST /api/alerts/:id/acknowledge': ['owner', 'buyer'],
  'GET /api/parts/:id/reorder-rule': ['owner', 'buyer'],
  'PUT /api/parts/:id/reorder-rule': ['owner', 'buyer'],
  'GET /api/parts/:id/reorder-suggestion': ['owner', 'buyer'],
  'GET /api/reorder': ['owner', 'buyer'],
  'GET /api/reorder-defaults': ['owner', 'buyer'],
  'PUT /api/reorder-defaults': ['owner', 'buyer'],
  'DELETE /api/reorder-defaults/:id': ['owner', 'buyer'],
  'GET /api/sourcing': ['owner', 'buyer'],
  'GET /api/exchange-rates': ['owner', 'buyer'],
  'PUT /api/exchange-rates/:currency': OWNER,
  'DELETE /api/exchange-rates/:currency': OWNER,
  'GET /api/purchase-orders': ALL,
  'POST /api/purchase-orders': ['owner', 'buyer'],
  'POST /api/purchase-orders/drafts': ['owner', 'buyer'],
  'GET /api/purchase-orders/open-lines': ['owner', 'buyer', 'staff'],
  'GET /api/purchase-orders/:id': ALL,
  'PATCH /api/purchase-orders/:id': ['owner', 'buyer'],
  'POST /api/purchase-orders/:id/send': ['owner', 'buyer'],
  'POST /api/purchase-orders/:id/cancel': ['owner', 'buyer'],
  'POST /api/purchase-orders/:id/receipts': ['owner', 'buyer', 'staff'],
  'GET /api/order-waits': ALL,
  'POST /api/order-waits': ['owner', 'buyer', 'machinist'],
  'DELETE /api/order-waits/:id': ['owner', 'buyer', 'machinist'],
  'GET /api/order-lines/:id/wait-candidates': ['owner', 'buyer', 'machinist'],
  // Money: everyone reads prices, estimates and payments; staff and the owner price jobs, take
  // approvals and payments; the labour price list is the owner's.
  'GET /api/labour-operations': ALL,
  'POST /api/labour-operations': OWNER,
  'PATCH /api/labour-operations/:id': OWNER,
  'GET /api/jobs/:id/estimate': ALL,
  'POST /api/jobs/:id/estimate/lines': ['owner', 'staff'],
  'PATCH /api/jobs/:id/estimate/lines/:lineId': ['owner', 'staff'],
  'DELETE /api/jobs/:id/estimate/lines/:lineId': ['owner', 'staff'],
  'POST /api/jobs/:id/estimate/discount': ['owner', 'staff'],
  'POST /api/jobs/:id/estimate/send': ['owner', 'staff'],
  'POST /api/jobs/:id/estimate/approval': ['owner', 'staff'],
  // The invoice issued at hand-back: everyone reads and prints it; staff and the owner correct it
  // with a credit note.
  'GET /api/jobs/:id/invoice': ALL,
  'GET /api/jobs/:id/invoice.pdf': ALL,
  'POST /api/jobs/:id/invoice/credit-notes': ['owner', 'staff'],
  'POST /api/jobs/:id/payment-requests': ['owner', 'staff'],
  'GET /api/jobs/:id/payments': ALL,
  'POST /api/jobs/:id/payments': ['owner', 'staff'],
  'POST /api/jobs/:id/payments/:paymentId/refund': ['owner', 'staff'],
  // The payment service's events: their signature is the credential.
  'POST /api/payments/webhook': 'public',
  // The owner's money figures, each with its CSV.
  'GET /api/insights/revenue': OWNER,
  'GET /api/insights/revenue.csv': OWNER,
  'GET /api/insights/estimates': OWNER,
  'GET /api/insights/estimates.csv': OWNER,
  'GET /api/insights/balances-owed': OWNER,
  'GET /api/insights/balances-owed.csv': OWNER,
  'GET /api/insights/deposits-held': OWNER,
  'GET /api/insights/deposits-held.csv': OWNER,
  // The customer's page: the token in the link is the credential.
  'GET /api/public/jobs/:token': 'public',
  'POST /api/public/jobs/:token/approve': 'public',
  'POST /api/public/jobs/:token/decline': 'public',
};

interface Found {
  key: string;
  method: string;
  path: string;
  access: Access | undefined;
}

function walk(routers: Router[]): Found[] {
  const found: Found[] = [];
  for (const router of routers) {
    for (const layer of router.stack as unknown as Array<{
      route?: {
        path: string;
        methods: Record<string, boolean>;
        stack: Array<{ handle: { access?: Access } }>;
      };
    }>) {
      if (!layer.route) continue;
      for (const method of Object.keys(layer.route.methods)) {
        const m = method.toUpperCase();
        found.push({
          key: `${m} ${layer.route.path}`,
          method: m,
          path: layer.route.path,
          access: layer.route.stack[0]?.handle.access,
        });
      }
    }
  }
  return found;
}

function concrete(path: string): string {
  // Placeholder ids that exist nowhere: allowed roles get 400/404, never 401/403.
  return path.replace(/:(\w+)/g, (_m, name: string) =>
    /^(n|cylinder|line)$/i.test(name)
      ? '1'
      : name === 'label'
        ? 'PU-NOPE'
        : '00000000-0000-4000-8000-000000000000',
  );
}

const routes = walk(createApp({ serveClient: false }).routers);
let clients: Record<Role, Client>;

beforeAll(async () => {
  clients = {} as Record<Role, Client>;
  for (const role of ROLES) clients[role] = await signedIn(role);
});
afterAll(closeTestApp);

describe('route × role matrix', () => {
  it('when the app is built, then every route declares its access and is in the expected table', () => {
    expect(routes.length).toBeGreaterThan(5);
    for (const r of routes) {
      expect({ route: r.key, declared: r.access !== undefined }).toEqual({
        route: r.key,
        declared: true,
      });
      expect({ route: r.key, access: r.access }).toEqual({ route: r.key, access: EXPECTED[r.key] });
    }
  });

  it('when a route is listed in the table, then it exists on the app', () => {
    const keys = new Set(routes.map((r) => r.key));
    for (const key of Object.keys(EXPECTED))
      expect({ key, exists: keys.has(key) }).toEqual({ key, exists: true });
  });

  it('when each route is called signed out and as each role, then 401 / 403 / allowed as declared', async () => {
    for (const r of routes) {
      const access = r.access;
      if (!access || access === 'public') continue;
      const url = concrete(r.path);
      const method = r.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
      const anon = new Client();
      await anon.prime();
      const anonRes = await anon.call(method, url).send({});
      expect({ route: r.key, who: 'signed out', status: anonRes.status }).toEqual({
        route: r.key,
        who: 'signed out',
        status: 401,
      });
      for (const role of ROLES) {
        const allowed = access === 'signed-in' || access.includes(role);
        const res = await clients[role].call(method, url).send({});
        const denied = res.status === 401 || res.status === 403;
        expect({ route: r.key, role, status: res.status, denied }).toEqual({
          route: r.key,
          role,
          status: res.status,
          denied: !allowed,
        });
      }
    }
    // Six calls per route on a machine shared with other runs: allow minutes, not seconds.
  }, 240000);
});

describe('deny by default', () => {
  it('when a route is registered without an access declaration, then the app refuses to start', () => {
    const rogue = express.Router();
    rogue.get('/api/rogue', (_req, res) => {
      res.json({ leaked: true });
    });
    expect(() => assertEveryRouteDeclared([rogue])).toThrow(/no access declaration/);
  });
});
