// Kit sales imported from the store's order export: one row per order line, the imports that
// brought them, and the column mapping each build's export uses. The two partial unique indexes
// keep an order line from ever being counted twice: by order and line id when the export has line
// ids, otherwise by order, SKU, quantity and revenue together.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE sale_imports (
      id             SERIAL PRIMARY KEY,
      build_id       INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      user_id        INTEGER REFERENCES users(id) ON DELETE SET NULL,
      file_name      TEXT CHECK (file_name IS NULL OR length(file_name) <= 200),
      lines_read     INTEGER NOT NULL CHECK (lines_read >= 0),
      lines_added    INTEGER NOT NULL CHECK (lines_added >= 0),
      lines_skipped  INTEGER NOT NULL CHECK (lines_skipped >= 0),
      created_at     TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX sale_imports_build_idx ON sale_imports (build_id, created_at);

    CREATE TABLE sale_lines (
      id             SERIAL PRIMARY KEY,
      build_id       INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      import_id      INTEGER REFERENCES sale_imports(id) ON DELETE SET NULL,
      order_id       TEXT NOT NULL CHECK (length(order_id) BETWEEN 1 AND 100),
      line_id        TEXT CHECK (line_id IS NULL OR length(line_id) BETWEEN 1 AND 100),
      sold_on        DATE NOT NULL,
      sku            TEXT NOT NULL CHECK (length(sku) BETWEEN 1 AND 100),
      quantity       INTEGER NOT NULL,
      revenue_cents  INTEGER NOT NULL,
      currency       TEXT NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      campaign       TEXT CHECK (campaign IS NULL OR length(campaign) <= 200),
      content        TEXT CHECK (content IS NULL OR length(content) <= 200),
      created_at     TIMESTAMPTZ NOT NULL DEFAULT now(),
      -- A sale has a positive quantity and revenue of zero or more; a refund has both below zero.
      CHECK ((quantity > 0 AND revenue_cents >= 0) OR (quantity < 0 AND revenue_cents < 0))
    );
    CREATE UNIQUE INDEX sale_lines_line_key ON sale_lines (build_id, order_id, line_id) WHERE line_id IS NOT NULL;
    CREATE UNIQUE INDEX sale_lines_content_key ON sale_lines (build_id, order_id, sku, quantity, revenue_cents) WHERE line_id IS NULL;
    CREATE INDEX sale_lines_build_sold_idx ON sale_lines (build_id, sold_on);

    CREATE TABLE sales_mappings (
      build_id    INTEGER PRIMARY KEY REFERENCES builds(id) ON DELETE CASCADE,
      mapping     JSONB NOT NULL,
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE sales_mappings; DROP TABLE sale_lines; DROP TABLE sale_imports;');
}
