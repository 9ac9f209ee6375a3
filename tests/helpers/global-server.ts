// One built app server for a whole test project; tests read its URL with inject('baseURL').
import type { TestProject } from 'vitest/node'
import { startAppServer } from './app-server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
  }
}

export default async function setup(project: TestProject) {
  const server = await startAppServer()
  project.provide('baseURL', server.url)
  return () => server.stop()
}
