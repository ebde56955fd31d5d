import pg from 'pg'
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as schema from './schema/index.js'

export type Database = NodePgDatabase<typeof schema>
/** A transaction handle has the same query API as the database. */
export type DatabaseOrTransaction = Database | Parameters<Parameters<Database['transaction']>[0]>[0]

export interface DatabaseHandle {
  db: Database
  pool: pg.Pool
  close: () => Promise<void>
}

export function connectDatabase(databaseUrl: string, maxConnections = 10): DatabaseHandle {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: maxConnections })
  // An idle client losing its connection must not crash the process; the next query reconnects.
  pool.on('error', () => {})
  const db = drizzle(pool, { schema })
  return { db, pool, close: () => pool.end() }
}
