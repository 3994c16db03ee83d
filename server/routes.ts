// The list of every feature's routes. A feature adds one line here; each register function declares
// its routes with `route()` so the role matrix and the API description see them.
import type { Router } from 'express';
import { registerSessionRoutes } from './session/session-routes';
import { registerUsersRoutes } from './users/users-routes';
import { registerAccountRoutes } from './account/account-routes';
import { registerSettingsRoutes } from './settings/settings-routes';
import { registerMailRoutes } from './mail/mail-routes';
import { registerAlertsRoutes } from './alerts/alerts-routes';
import { registerPurchasingRoutes } from './purchasing/purchasing-routes';
import { registerOpenApiRoutes } from './openapi/openapi-routes';
import { registerCatalogRoutes } from './catalog/catalog-routes';
import { registerStockRoutes } from './stock/stock-routes';
import { registerJobsRoutes } from './jobs/jobs-routes';
import { registerInsightsRoutes } from './insights/insights-routes';
import { registerSuppliersRoutes } from './suppliers/suppliers-routes';
import { registerImportsRoutes } from './imports/imports-routes';
import { registerExportsRoutes } from './exports/exports-routes';
import { registerAuditRoutes } from './audit/audit-routes';
import { registerMoneyRoutes } from './money/money-routes';
import { registerPublicRoutes } from './money/public-routes';
import { registerInvoiceRoutes } from './money/invoice-routes';
import { registerPaymentRoutes } from './money/payments-routes';
import { registerCustomersRoutes } from './customers/customers-routes';
import { registerHomeRoutes } from './home/home-routes';

export function registerAllRoutes(api: Router): void {
  registerSessionRoutes(api);
  registerUsersRoutes(api);
  registerAccountRoutes(api);
  registerSettingsRoutes(api);
  registerMailRoutes(api);
  registerAlertsRoutes(api);
  registerPurchasingRoutes(api);
  registerOpenApiRoutes(api);
  registerCatalogRoutes(api);
  registerStockRoutes(api);
  registerJobsRoutes(api);
  registerInsightsRoutes(api);
  registerSuppliersRoutes(api);
  registerImportsRoutes(api);
  registerExportsRoutes(api);
  registerAuditRoutes(api);
  registerMoneyRoutes(api);
  registerPublicRoutes(api);
  registerInvoiceRoutes(api);
  registerPaymentRoutes(api);
  registerCustomersRoutes(api);
  registerHomeRoutes(api);
}
