// Applies the committed drizzle/ migrations to DATABASE_URL. Safe to run any number of times.
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import { loadConfig } from '../server/config.js'
import { connectDatabase } from '../server/db/client.js'

const config = loadConfig()
const database = connectDatabase(config.databaseUrl, 1)
try {
  await migrate(database.db, { migrationsFolder: 'drizzle' })
  console.log('==> database schema is up to date')
} finally {
  await database.close()
}
