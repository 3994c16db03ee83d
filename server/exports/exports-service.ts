// CSV exports for a spreadsheet: the stock list, one family's step ladder, and the price comparison
// across suppliers. Text from people and suppliers is neutralised against formula injection by the
// shared CSV writer; lengths go out in both units, exactly.
import { toLengthJson } from '../../shared/lengths';
import type { CsvTable } from '../insights/insights-csv';
import { ladder } from '../catalog/ladder-service';
import type { LadderStepJson } from '../../shared/api/catalog';
import { maySeeMoney } from '../../shared/money-visibility';
import type { Role } from '../../shared/session-types';
import * as repo from './exports-repository';

/** The stock list; the average cost column only for roles that may see costs (staff may not). */
export async function stockTable(role: Role): Promise<CsvTable<repo.StockRow>> {
  const rows = await repo.stockList();
  const nominal = (r: repo.StockRow) => (r.nominal_nm === null ? null : toLengthJson(r.nominal_nm));
  return {
    name: 'stock',
    rows,
    columns: [
      { header: 'SKU', text: (r) => r.sku },
      { header: 'Kind', value: (r) => r.kind },
      { header: 'Description', text: (r) => r.description },
      { header: 'Family', text: (r) => r.family_code },
      { header: 'Step', text: (r) => r.step_label },
      { header: 'Nominal bore (mm)', value: (r) => nominal(r)?.mm },
      { header: 'Nominal bore (in)', value: (r) => nominal(r)?.in },
      { header: 'On hand', value: (r) => r.on_hand },
      { header: 'Held', value: (r) => r.held },
      { header: 'Free', value: (r) => r.on_hand - r.held },
      { header: 'Bin', text: (r) => r.bin },
      { header: 'Sale price', value: (r) => r.sale_price },
      ...(maySeeMoney(role, 'cost')
        ? [{ header: 'Average cost', value: (r: repo.StockRow) => r.average_cost }]
        : []),
      { header: 'GTIN', value: (r) => r.gtin },
    ],
  };
}

export async function ladderTable(familyId: string): Promise<CsvTable<LadderStepJson>> {
  const answer = await ladder(familyId);
  return {
    name: `ladder-${answer.family.code}`,
    rows: answer.steps,
    columns: [
      { header: 'Family', text: () => answer.family.code },
      { header: 'Step', text: (s) => s.label },
      { header: 'Oversize (mm)', value: (s) => s.offset.mm },
      { header: 'Oversize (in)', value: (s) => s.offset.in },
      { header: 'Nominal bore (mm)', value: (s) => s.nominalBore.mm },
      { header: 'Nominal bore (in)', value: (s) => s.nominalBore.in },
      { header: 'Pistons on hand', value: (s) => s.pistons.onHand },
      { header: 'Pistons held', value: (s) => s.pistons.held },
      { header: 'Pistons free', value: (s) => s.pistons.free },
      { header: 'Pistons on order', value: (s) => s.pistons.onOrder },
      { header: 'Ring sets free', value: (s) => s.rings.free },
      { header: 'Kits free', value: (s) => s.kitsFree },
      { header: 'Nothing free', value: (s) => (s.nothingFree ? 'yes' : 'no') },
    ],
  };
}

export async function priceComparisonTable(
  familyId: string | undefined,
): Promise<CsvTable<repo.OfferRow>> {
  const rows = await repo.offers(familyId);
  return {
    name: 'price-comparison',
    rows,
    columns: [
      { header: 'Part SKU', text: (r) => r.part_sku },
      { header: 'Part', text: (r) => r.part_description },
      { header: 'Family', text: (r) => r.family_code },
      { header: 'Step', text: (r) => r.step_label },
      { header: 'Supplier', text: (r) => r.supplier_name },
      { header: 'Supplier SKU', text: (r) => r.supplier_sku },
      { header: 'Supplier description', text: (r) => r.supplier_description },
      { header: 'Price', value: (r) => r.price },
      { header: 'Currency', value: (r) => r.currency },
      { header: 'Rank in currency', value: (r) => r.rank_in_currency },
      { header: 'Available', value: (r) => r.available },
      { header: 'Lead days', value: (r) => r.lead_days ?? r.supplier_lead_days },
      { header: 'Last seen', value: (r) => r.last_seen_at?.toISOString().slice(0, 10) },
    ],
  };
}
