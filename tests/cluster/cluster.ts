// The running local cluster (scripts/cluster/): its HTTP address through HAProxy, its nodes, and
// the parts tests stop and start (scripts/cluster/node.sh).
import { execFile } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { createConnection } from 'mysql2/promise'
import { ApiClient } from '../helpers/api-client'

const run = promisify(execFile)
const env = process.env

/** HAProxy's HTTP listener in front of the app processes. */
export const HTTP_URL = `http://127.0.0.1:${env.CLUSTER_HTTP_PORT ?? 4442}`

const NODE_PORTS: Record<number, number> = {
  1: Number(env.CLUSTER_NODE1_PORT ?? 4401), 2: Number(env.CLUSTER_NODE2_PORT ?? 4402), 3: Number(env.CLUSTER_NODE3_PORT ?? 4403),
}
const WRITE_PORT = Number(env.CLUSTER_WRITE_PORT ?? 4440)

export async function clientThroughProxy(email = 'manager@fernhollow.test'): Promise<ApiClient> {
  // Right after cluster:start HAProxy may not have seen an app process pass its health check yet
  // (503 "no server is available"): poll for that, for up to a minute.
  const deadline = Date.now() + 60_000
  for (;;) {
    const client = new ApiClient(HTTP_URL)
    try {
      await client.signIn(email)
      return client
    } catch (error) {
      if (Date.now() > deadline || !String(error).includes('503')) throw error
      await new Promise((resolve) => setTimeout(resolve, 500))
    }
  }
}

/** node.sh start|stop|kill|app-start|app-kill N */
export async function clusterPart(action: string, n: number): Promise<void> {
  await run('bash', ['scripts/cluster/node.sh', action, String(n)], { env, maxBuffer: 10_000_000 })
}

async function queryPort(port: number, sql: string): Promise<Record<string, unknown>[]> {
  const connection = await createConnection({ host: '127.0.0.1', port, user: env.DB_USER ?? 'cuspline', password: env.DB_PASSWORD, connectTimeout: 2000 })
  try {
    const [rows] = await connection.query(sql)
    return rows as Record<string, unknown>[]
  } finally {
    await connection.end()
  }
}

async function statusOf(port: number, name: string): Promise<string | null> {
  try {
    const rows = await queryPort(port, `SHOW STATUS LIKE '${name}'`)
    return rows[0] ? String(rows[0].Value) : null
  } catch {
    return null
  }
}

/** wsrep_cluster_size as node n sees it (null when the node does not answer). */
export async function clusterSizeSeenBy(n: number): Promise<number | null> {
  const value = await statusOf(NODE_PORTS[n]!, 'wsrep_cluster_size')
  return value === null ? null : Number(value)
}

/** The node HAProxy's write listener sends a new connection to (n1, n2 or n3). */
export async function writerNode(): Promise<string> {
  const rows = await queryPort(WRITE_PORT, 'SELECT @@wsrep_node_name AS name')
  return String(rows[0]!.name)
}

export function statuses(responses: Array<{ status: number }>): Record<number, number> {
  return responses.reduce<Record<number, number>>((counts, response) => ({ ...counts, [response.status]: (counts[response.status] ?? 0) + 1 }), {})
}

export interface Answer {
  status: number
  body: { id?: number } & Record<string, unknown>
  attempts: number
  /** When the answering try began, and when its answer came (epoch ms). */
  startedAt: number
  at: number
}

/**
 * Books as a careful client does: the same Idempotency-Key on every try, tried again after a
 * network error or a 5xx (the proxy or the database was away), until a 201 or a 4xx answer.
 */
export async function bookWithRetry(client: ApiClient, body: unknown, key: string, deadlineMs = 120_000): Promise<Answer> {
  const giveUp = Date.now() + deadlineMs
  for (let attempts = 1; ; attempts += 1) {
    const startedAt = Date.now()
    try {
      const response = await client.post('/api/visits', body, { headers: { 'idempotency-key': key } })
      if (response.status < 500) return { status: response.status, body: response.body, attempts, startedAt, at: Date.now() }
    } catch {
      // connection reset or refused: try again
    }
    if (Date.now() > giveUp) return { status: 0, body: {}, attempts, startedAt, at: Date.now() }
    await new Promise((wait) => setTimeout(wait, Math.min(1000, 50 * attempts)))
  }
}

/** Polls `check` until it is true (no timed assertion: the deadline only ends a hopeless wait). */
export async function waitFor(check: () => Promise<boolean>, what: string, deadlineMs = 180_000): Promise<number> {
  const started = Date.now()
  while (!(await check())) {
    if (Date.now() - started > deadlineMs) throw new Error(`gave up waiting for ${what}`)
    await new Promise((wait) => setTimeout(wait, 250))
  }
  return Date.now() - started
}

/** Runs `count` jobs with `workers` at a time; `onDone` sees each answer as it arrives. */
export async function burst<T>(count: number, workers: number, job: (index: number) => Promise<T>, onDone: (answer: T, done: number) => void = () => {}): Promise<T[]> {
  const answers: T[] = new Array(count)
  let next = 0
  let done = 0
  await Promise.all(Array.from({ length: workers }, async () => {
    while (next < count) {
      const index = next
      next += 1
      answers[index] = await job(index)
      done += 1
      onDone(answers[index]!, done)
    }
  }))
  return answers
}

/** Pauses (SIGSTOP) or resumes (SIGCONT) the cluster's mail catcher (started by setsid, so it leads its own group), so sends hang mid-SMTP. */
export function signalMailCatcher(signal: 'SIGSTOP' | 'SIGCONT'): void {
  const pid = Number(readFileSync(join(env.CLUSTER_DIR ?? '.data/cluster', 'mail-catcher.pid'), 'utf8'))
  process.kill(-pid, signal) // its process group: tsx runs the catcher in a child process
}
