// Sales settings on the build (the currency its store sells in, the days after an episode's release
// in which an untagged sale still counts as assisted) and the store's own SKU on a part, for when
// the store sells a part under another code than its part number.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE builds
      ADD COLUMN currency TEXT NOT NULL DEFAULT 'USD' CHECK (currency ~ '^[A-Z]{3}$'),
      ADD COLUMN attribution_window_days INTEGER NOT NULL DEFAULT 30 CHECK (attribution_window_days BETWEEN 0 AND 365);
    ALTER TABLE parts ADD COLUMN store_sku TEXT CHECK (store_sku IS NULL OR length(store_sku) BETWEEN 1 AND 60);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE parts DROP COLUMN store_sku;
    ALTER TABLE builds DROP COLUMN attribution_window_days, DROP COLUMN currency;
  `);
}
