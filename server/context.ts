import type { DataSource } from 'typeorm'
import type { Config } from './config'

export interface Logger {
  info(message: string): void
  warn(message: string, error?: unknown): void
  error(message: string, error?: unknown): void
}

/** What every router and service is built from: configuration, the database, a logger. */
export interface AppContext {
  config: Config
  db: DataSource
  log: Logger
}

export function consoleLogger(prefix = 'conewright'): Logger {
  return {
    info: (message) => console.log(`[${prefix}] ${message}`),
    warn: (message, error) => console.warn(`[${prefix}] ${message}`, error ?? ''),
    error: (message, error) => console.error(`[${prefix}] ${message}`, error ?? ''),
  }
}

export const silentLogger: Logger = { info() {}, warn() {}, error() {} }

/**
 * One line when a dependency goes away and one when it is back, however many requests meet the
 * outage in between: a stream of identical stack traces hides more than it tells.
 */
export function outageLog(log: Logger, what: string) {
  let downSince: number | null = null
  return {
    get down() {
      return downSince !== null
    },
    failed(error: unknown) {
      if (downSince !== null) return
      downSince = Date.now()
      log.warn(`${what} is unreachable: ${(error as Error)?.message ?? error}`)
    },
    recovered(detail = '') {
      if (downSince === null) return
      const seconds = Math.round((Date.now() - downSince) / 1000)
      downSince = null
      log.info(`${what} is back after ${seconds} s${detail ? `: ${detail}` : ''}`)
    },
  }
}
