// The load client the HTTP benchmarks share: node:http on kept-alive sockets (lighter than fetch, so
// more of the machine goes to the app and the database), sign-in, and timing of repeated requests.
import { readFileSync } from 'node:fs'
import { Agent, request } from 'node:http'
import { performance } from 'node:perf_hooks'
import { cpuSeconds, percentile } from './bench'

export const benchAgent = new Agent({ keepAlive: true, maxSockets: 32 })

export interface Answer { status: number; body: string; headers: Record<string, string | string[] | undefined> }

export function call(url: string, options: { method?: string; cookie?: string; body?: unknown; headers?: Record<string, string> } = {}): Promise<Answer> {
  const body = options.body === undefined ? undefined : JSON.stringify(options.body)
  return new Promise((done, fail) => {
    const sent = request(url, {
      method: options.method ?? (body ? 'POST' : 'GET'), agent: benchAgent,
      headers: { ...(options.cookie ? { cookie: options.cookie } : {}), ...(body ? { 'content-type': 'application/json', 'content-length': String(Buffer.byteLength(body)) } : {}), ...options.headers },
    }, (response) => {
      const chunks: Buffer[] = []
      response.on('data', (chunk: Buffer) => chunks.push(chunk))
      response.on('end', () => done({ status: response.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), headers: response.headers }))
    })
    sent.on('error', fail)
    sent.end(body)
  })
}

/** A session cookie for this account (sign-in may first clear an older cookie: the last with a value). */
export async function signIn(baseURL: string, email: string, password: string): Promise<string> {
  const login = await fetch(`${baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) })
  const cookies = login.headers.getSetCookie().map((line) => line.split(';')[0]!).filter((pair) => !pair.endsWith('='))
  if (login.status !== 200 || cookies.length === 0) throw new Error(`sign-in answered ${login.status} with no session cookie`)
  return cookies[cookies.length - 1]!
}

export interface Timing { median: number; p95: number; runs: number; appCpuMs?: number }

/** Runs `request` one at a time `runs` times after `warmUp` untimed runs: wall-clock median and p95,
 * and the app process's CPU per request when its pid is given. Every answer must be `expect`. */
export async function timeRequests(runs: number, warmUp: number, request: () => Promise<Answer>, options: { appPid?: number; expect?: number } = {}): Promise<Timing> {
  const expect = options.expect ?? 200
  for (let index = 0; index < warmUp; index += 1) await checked(request, expect)
  const times: number[] = []
  const cpuBefore = options.appPid ? cpuSeconds(options.appPid) : 0
  for (let index = 0; index < runs; index += 1) {
    const begin = performance.now()
    await checked(request, expect)
    times.push(performance.now() - begin)
  }
  const appCpuMs = options.appPid ? ((cpuSeconds(options.appPid) - cpuBefore) * 1000) / runs : undefined
  return { median: percentile(times, 0.5), p95: percentile(times, 0.95), runs, appCpuMs }
}

async function checked(request: () => Promise<Answer>, expect: number): Promise<Answer> {
  const answer = await request()
  if (answer.status !== expect) throw new Error(`answered ${answer.status}, not ${expect}: ${answer.body.slice(0, 300)}`)
  return answer
}

export function timingLine(timing: Timing): string {
  const cpu = timing.appCpuMs === undefined ? '' : `, app CPU ${timing.appCpuMs.toFixed(1)} ms per request`
  return `median ${timing.median.toFixed(1)} ms, p95 ${timing.p95.toFixed(1)} ms (${timing.runs} runs${cpu})`
}

/** Resident memory of a process in MiB, from /proc (Linux). */
export function residentMiB(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find((entry) => entry.startsWith('VmRSS:'))
  return Number(line?.replace(/\D+/g, '') ?? 0) / 1024
}
