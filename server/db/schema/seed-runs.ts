import { mysqlTable, timestamp, varchar } from 'drizzle-orm/mysql-core';

/**
 * One row per demo-data set applied, so a second start never seeds twice and never overwrites
 * what a user changed in the demo organization.
 */
export const seedRuns = mysqlTable('seed_runs', {
  name: varchar({ length: 80 }).primaryKey(),
  appliedAt: timestamp().notNull().defaultNow(),
});
