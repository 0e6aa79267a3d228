// The one Sequelize instance, on DATABASE_URL. Counts queries so tests can catch N+1 patterns.
import { Sequelize } from 'sequelize';
import pg from 'pg';
import { config } from '../config';

// DATE-only columns stay plain 'YYYY-MM-DD' strings (no time-zone shifts).
pg.types.setTypeParser(1082, (v: string) => v);

export const queryCounter = { count: 0 };

export const sequelize = new Sequelize(config().DATABASE_URL, {
  dialect: 'postgres',
  logging: () => {
    queryCounter.count += 1;
  },
  pool: { max: config().DATABASE_POOL_MAX, min: 0, idle: 10_000 },
  define: { underscored: true },
});
