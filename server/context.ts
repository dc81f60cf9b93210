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
