// The MariaDB that the scripts start holds the practice's data (npm start and npm test share it):
// every commit must reach the disk before it is acknowledged. MariaDB documents both settings in
// its system variable reference (innodb_flush_log_at_trx_commit, sync_binlog).
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, testDb } from '../helpers/db'

afterAll(closeTestDb)

describe('the database server', () => {
  it('flushes the redo log at every commit, and would sync a binary log at every commit', async () => {
    const [rows] = await testDb().raw('SELECT @@GLOBAL.innodb_flush_log_at_trx_commit AS flush, @@GLOBAL.sync_binlog AS syncBinlog')
    const settings = (rows as Array<{ flush: number | string; syncBinlog: number | string }>)[0]!
    expect(Number(settings.flush)).toBe(1)
    // No binary log today; scripts/db-start.sh sets sync_binlog=1 anyway, so turning one on stays durable.
    expect(Number(settings.syncBinlog)).toBe(1)
  })
})
