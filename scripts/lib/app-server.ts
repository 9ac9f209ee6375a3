// Starts the built app (.output) as a real Node process on a free loopback port.
import { spawn, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'
import { resolve } from 'node:path'

export interface RunningServer {
  url: string
  pid: number
  /** What the process has printed so far (stdout and stderr). */
  output: () => string
  stop: () => Promise<void>
}

export async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer()
    probe.once('error', fail)
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address()
      const port = typeof address === 'object' && address ? address.port : 0
      probe.close(() => done(port))
    })
  })
}

async function waitUntilAnswering(url: string, child: ChildProcess, closed: Promise<unknown>, output: () => string): Promise<void> {
  const deadline = Date.now() + 30_000
  while (Date.now() < deadline) {
    if (child.exitCode !== null) {
      await closed // all it printed has been read
      throw new Error(`app server exited early with code ${child.exitCode}:\n${output()}`)
    }
    try {
      const response = await fetch(`${url}/api/me`)
      if (response.status === 401) return
    } catch {
      // not listening yet
    }
    await new Promise((wait) => setTimeout(wait, 150))
  }
  throw new Error(`app server did not answer at ${url}:\n${output()}`)
}

/** Extra environment (for example a short idle timeout) applies to this process only. */
export async function startAppServer(extraEnv: Record<string, string> = {}, nodeArgs: string[] = []): Promise<RunningServer> {
  const port = await freePort()
  const url = `http://127.0.0.1:${port}`
  let log = ''
  // The same Node flags as npm start (APP_NODE_FLAGS, scripts/lib/env.sh), then the caller's own.
  const appFlags = (process.env.APP_NODE_FLAGS ?? '').split(/\s+/).filter(Boolean)
  const child = spawn(process.execPath, [...appFlags, ...nodeArgs, resolve('.output/server/index.mjs')], {
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), NITRO_PORT: String(port), NUXT_MAIL_PUBLIC_URL: url, ...extraEnv },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout?.on('data', (chunk) => { log += chunk })
  child.stderr?.on('data', (chunk) => { log += chunk })
  const closed = new Promise((done) => child.once('close', done))
  await waitUntilAnswering(url, child, closed, () => log)
  return {
    url,
    pid: child.pid!,
    output: () => log,
    stop: () => new Promise((done) => {
      if (child.exitCode !== null) return done()
      child.once('exit', () => done())
      child.kill('SIGTERM')
    }),
  }
}
