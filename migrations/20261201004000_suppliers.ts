// Suppliers, what each one offers (supplier items with their price history), the price lists brought
// in from them, and the column mapping remembered per supplier. Money is NUMERIC(14,4) with an ISO 4217
// code; sizes are integer nanometres like everywhere else.
//
// A price list goes through two steps. The upload reads and checks the whole file and stages its valid
// rows in price_list_import_rows (status 'previewed'); nothing a supplier offers changes yet. The commit
// applies the staged rows to supplier_items in one transaction (status 'committed') and empties the
// staging rows. A file whose SHA-256 is already committed for the supplier is a duplicate.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE suppliers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      -- People to talk to, phone numbers: free text as the buyer keeps it.
      contacts text NOT NULL DEFAULT '',
      -- Where purchase orders go.
      email text,
      currency text NOT NULL,
      lead_days integer NOT NULL,
      min_order numeric(14, 4) NOT NULL DEFAULT 0,
      shipping_cost numeric(14, 4) NOT NULL DEFAULT 0,
      notes text NOT NULL DEFAULT '',
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT suppliers_name_check CHECK (length(trim(name)) > 0 AND length(name) <= 120),
      CONSTRAINT suppliers_email_check
        CHECK (email IS NULL OR (email = lower(email) AND position('@' in email) > 1)),
      -- The code itself is checked against the ISO 4217 list in code; the shape here.
      CONSTRAINT suppliers_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT suppliers_lead_days_check CHECK (lead_days BETWEEN 0 AND 365),
      CONSTRAINT suppliers_money_check CHECK (min_order >= 0 AND shipping_cost >= 0)
    );
    CREATE UNIQUE INDEX suppliers_name_unique ON suppliers (lower(name));

    CREATE TABLE price_list_imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      supplier_id uuid NOT NULL REFERENCES suppliers (id),
      user_id uuid REFERENCES users (id),
      file_name text NOT NULL,
      file_bytes bigint NOT NULL,
      sha256 text NOT NULL,
      status text NOT NULL DEFAULT 'previewed',
      -- {"encoding","delimiter","decimal","headerLine"} and the header line's column names.
      detected jsonb NOT NULL,
      headers jsonb NOT NULL,
      -- Field → column name, plus the size unit.
      mapping jsonb NOT NULL,
      -- {"rows","ok","errors","new","up","down","unchanged","missing","unmapped"}.
      counts jsonb NOT NULL,
      -- The first row errors and warnings, [{"line","field"?,"message"}], sorted by line.
      errors jsonb NOT NULL DEFAULT '[]',
      warnings jsonb NOT NULL DEFAULT '[]',
      sample jsonb NOT NULL DEFAULT '[]',
      price_changes jsonb NOT NULL DEFAULT '{}',
      -- The last commit failure, kept for the import log; the import can be committed again.
      failure text,
      duplicate_of uuid REFERENCES price_list_imports (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      committed_by uuid REFERENCES users (id),
      committed_at timestamptz,
      CONSTRAINT price_list_imports_status_check
        CHECK (status IN ('previewed', 'committed', 'duplicate', 'failed')),
      CONSTRAINT price_list_imports_sha256_check CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      CONSTRAINT price_list_imports_bytes_check CHECK (file_bytes >= 0),
      CONSTRAINT price_list_imports_file_name_check CHECK (length(file_name) BETWEEN 1 AND 255),
      CONSTRAINT price_list_imports_committed_check
        CHECK ((status = 'committed') = (committed_at IS NOT NULL)),
      CONSTRAINT price_list_imports_duplicate_check
        CHECK ((status = 'duplicate') = (duplicate_of IS NOT NULL))
    );
    -- One committed import per file per supplier: a second commit of the same bytes is a duplicate.
    CREATE UNIQUE INDEX price_list_imports_committed_sha_unique
      ON price_list_imports (supplier_id, sha256) WHERE status = 'committed';
    CREATE INDEX price_list_imports_supplier_idx ON price_list_imports (supplier_id, created_at DESC);
    CREATE INDEX price_list_imports_created_idx ON price_list_imports (created_at DESC);

    -- The valid rows of a previewed list, waiting for the commit (ok), and the SKUs of rows with errors
    -- (not ok), which must not count as missing from the list.
    CREATE TABLE price_list_import_rows (
      import_id uuid NOT NULL REFERENCES price_list_imports (id) ON DELETE CASCADE,
      sku text NOT NULL,
      ok boolean NOT NULL,
      line integer NOT NULL,
      description text NOT NULL DEFAULT '',
      size_nm integer,
      oversize_nm integer,
      price numeric(14, 4),
      currency text,
      available integer,
      lead_days integer,
      gtin text,
      PRIMARY KEY (import_id, sku),
      CONSTRAINT price_list_import_rows_ok_check
        CHECK (NOT ok OR (price > 0 AND currency ~ '^[A-Z]{3}$'))
    );

    CREATE TABLE supplier_items (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      supplier_id uuid NOT NULL REFERENCES suppliers (id),
      sku text NOT NULL,
      description text NOT NULL DEFAULT '',
      size_nm integer,
      oversize_nm integer,
      -- The catalog part this is; null while unmapped (waiting in the mapping queue).
      part_id uuid REFERENCES parts (id),
      price numeric(14, 4) NOT NULL,
      currency text NOT NULL,
      -- What the supplier reports available; null when the list does not say.
      available integer,
      lead_days integer,
      gtin text,
      last_import_id uuid REFERENCES price_list_imports (id),
      -- A full list no longer contains it.
      dropped boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT supplier_items_sku_check CHECK (length(trim(sku)) > 0 AND length(sku) <= 64),
      CONSTRAINT supplier_items_size_check CHECK (size_nm IS NULL OR size_nm > 0),
      CONSTRAINT supplier_items_oversize_check CHECK (oversize_nm IS NULL OR oversize_nm >= 0),
      CONSTRAINT supplier_items_price_check CHECK (price > 0),
      CONSTRAINT supplier_items_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT supplier_items_available_check CHECK (available IS NULL OR available >= 0),
      CONSTRAINT supplier_items_lead_days_check CHECK (lead_days IS NULL OR lead_days BETWEEN 0 AND 365),
      CONSTRAINT supplier_items_gtin_check CHECK (gtin IS NULL OR gtin ~ '^([0-9]{8}|[0-9]{12,14})$'),
      CONSTRAINT supplier_items_sku_unique UNIQUE (supplier_id, sku)
    );
    CREATE INDEX supplier_items_part_idx ON supplier_items (part_id) WHERE part_id IS NOT NULL;
    CREATE INDEX supplier_items_unmapped_idx ON supplier_items (supplier_id, sku)
      WHERE part_id IS NULL AND NOT dropped;

    -- Every price an item has had, from the import that brought it.
    CREATE TABLE supplier_item_prices (
      id bigserial PRIMARY KEY,
      item_id uuid NOT NULL REFERENCES supplier_items (id) ON DELETE CASCADE,
      price numeric(14, 4) NOT NULL,
      currency text NOT NULL,
      effective_from timestamptz NOT NULL,
      import_id uuid REFERENCES price_list_imports (id),
      CONSTRAINT supplier_item_prices_price_check CHECK (price > 0),
      CONSTRAINT supplier_item_prices_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT supplier_item_prices_once UNIQUE (item_id, effective_from)
    );

    -- The column mapping confirmed for a supplier's lists, used for the next list with those columns.
    CREATE TABLE supplier_mappings (
      supplier_id uuid PRIMARY KEY REFERENCES suppliers (id) ON DELETE CASCADE,
      mapping jsonb NOT NULL,
      headers jsonb NOT NULL,
      user_id uuid REFERENCES users (id),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE supplier_mappings;
    DROP TABLE supplier_item_prices;
    DROP TABLE supplier_items;
    DROP TABLE price_list_import_rows;
    DROP TABLE price_list_imports;
    DROP TABLE suppliers;
  `);
}
