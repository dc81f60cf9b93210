/** The same server address with another database name. */
export function withDatabase(url: string, database: string) {
  const parsed = new URL(url)
  parsed.pathname = `/${database}`
  return parsed.toString()
}
