/**
 * Builds a Drizzle database on a mysql2 pool. Used by the app's client (`db/client.ts`) and by the
 * command-line scripts (migrate, seed), which run outside Next and so cannot import `server-only`.
 */
import mysql from 'mysql2';
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import * as schema from '@/db/schema';

export type Database = MySql2Database<typeof schema>;
/** A database or an open transaction: what every write helper accepts. */
export type Executor = Database | Parameters<Parameters<Database['transaction']>[0]>[0];

export interface DatabaseHandle {
  db: Database;
  /** Closes every pooled connection. */
  close: () => Promise<void>;
}

/** Opens a pool on `url` whose sessions run in UTC, so stored `datetime` values are UTC. */
export function createDatabase(url: string, { connectionLimit = 10 } = {}): DatabaseHandle {
  const pool = mysql.createPool({ uri: url, connectionLimit, timezone: 'Z', dateStrings: false });
  pool.on('connection', (connection) => {
    connection.query("SET time_zone = '+00:00'");
  });
  const db = drizzle({ client: pool, schema, mode: 'default' });
  return {
    db,
    close: () => new Promise<void>((resolve, reject) => pool.end((error) => (error ? reject(error) : resolve()))),
  };
}
