// Reads the form-encoded parameters the stripe SDK sends (`a[b][0][c]=v`, `expand[]=x`) and checks them
// the way Stripe does: unknown parameters are refused, required ones named in the error's `param`,
// and an empty string means "unset" (refused where the parameter cannot be unset).
import { invalidRequest } from './errors'

export type FormValue = string | FormNode
export interface FormNode {
  [key: string]: FormValue
}

// Splits `line_items[0][price_data][currency]` into ['line_items', '0', 'price_data', 'currency'].
function keySegments(key: string): string[] {
  const open = key.indexOf('[')
  if (open <= 0) return [key]
  const segments = [key.slice(0, open)]
  const pattern = /\[([^\]]*)\]/g
  for (const match of key.slice(open).matchAll(pattern)) segments.push(match[1])
  return segments
}

export function parseForm(encoded: string): FormNode {
  const root: FormNode = {}
  for (const [key, value] of new URLSearchParams(encoded)) {
    const segments = keySegments(key)
    let node = root
    segments.forEach((segment, index) => {
      // `[]` appends, the way `expand[]=a&expand[]=b` builds a list.
      const name = segment === '' ? String(Object.keys(node).length) : segment
      if (index === segments.length - 1) {
        node[name] = value
        return
      }
      const next = node[name]
      if (typeof next === 'object') {
        node = next
      } else {
        const child: FormNode = {}
        node[name] = child
        node = child
      }
    })
  }
  return root
}

interface Requirement {
  required?: boolean
}

const EMAIL_PATTERN = /^[^\s@]+@[^\s@]+\.[^\s@]+$/

export class FormParams {
  private readonly node: FormNode
  private readonly prefix: string
  private readonly read = new Set<string>()
  private readonly children: FormParams[] = []

  constructor(node: FormNode, prefix = '') {
    this.node = node
    this.prefix = prefix
  }

  path(name: string): string {
    return this.prefix ? `${this.prefix}[${name}]` : name
  }

  private take(name: string, requirement: Requirement): FormValue | undefined {
    this.read.add(name)
    const value = this.node[name]
    if (value === undefined) {
      if (requirement.required) {
        throw invalidRequest(`Missing required param: ${this.path(name)}.`, {
          code: 'parameter_missing',
          param: this.path(name),
        })
      }
      return undefined
    }
    if (value === '') {
      if (requirement.required) {
        throw invalidRequest(
          `You passed an empty string for '${this.path(name)}'. We assume empty values are an attempt to unset a ` +
            `parameter; however '${this.path(name)}' cannot be unset. You should remove '${this.path(name)}' from ` +
            'your request or supply a non-empty value.',
          { code: 'parameter_invalid_empty', param: this.path(name) },
        )
      }
      return undefined
    }
    return value
  }

  private scalar(name: string, requirement: Requirement): string | undefined {
    const value = this.take(name, requirement)
    if (value === undefined) return undefined
    if (typeof value !== 'string') {
      throw invalidRequest(`Invalid string: ${JSON.stringify(value)}`, { param: this.path(name) })
    }
    return value
  }

  string(name: string, requirement: Requirement & { maxLength?: number } = {}): string | undefined {
    const value = this.scalar(name, requirement)
    if (value !== undefined && requirement.maxLength !== undefined && value.length > requirement.maxLength) {
      throw invalidRequest(`Invalid ${this.path(name)}: must be at most ${requirement.maxLength} characters`, { param: this.path(name) })
    }
    return value
  }

  integer(name: string, requirement: Requirement & { min?: number } = {}): number | undefined {
    const value = this.scalar(name, requirement)
    if (value === undefined) return undefined
    if (!/^-?\d+$/.test(value) || !Number.isSafeInteger(Number(value))) {
      throw invalidRequest(`Invalid integer: ${value}`, { code: 'parameter_invalid_integer', param: this.path(name) })
    }
    const number = Number(value)
    if (requirement.min !== undefined && number < requirement.min) {
      throw invalidRequest(
        requirement.min === 1 ? 'Invalid positive integer' : `This value must be greater than or equal to ${requirement.min}.`,
        { code: 'parameter_invalid_integer', param: this.path(name) },
      )
    }
    return number
  }

  oneOf<T extends string>(name: string, allowed: readonly T[], requirement: Requirement = {}): T | undefined {
    const value = this.scalar(name, requirement)
    if (value === undefined) return undefined
    if (!(allowed as readonly string[]).includes(value)) {
      const choices = allowed.length > 1 ? `${allowed.slice(0, -1).join(', ')}, or ${allowed[allowed.length - 1]}` : allowed[0]
      throw invalidRequest(`Invalid ${name}: must be one of ${choices}`, { param: this.path(name) })
    }
    return value as T
  }

  url(name: string, requirement: Requirement = {}): string | undefined {
    const value = this.scalar(name, requirement)
    if (value === undefined) return undefined
    // `{CHECKOUT_SESSION_ID}` is a template Stripe fills in later; braces are not valid in a URL as such.
    const candidate = value.replaceAll('{CHECKOUT_SESSION_ID}', 'cs_placeholder')
    let parsed: URL
    try {
      parsed = new URL(candidate)
    } catch {
      throw invalidRequest('Not a valid URL', { code: 'url_invalid', param: this.path(name) })
    }
    if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') {
      throw invalidRequest('Not a valid URL', { code: 'url_invalid', param: this.path(name) })
    }
    return value
  }

  email(name: string, requirement: Requirement = {}): string | undefined {
    const value = this.scalar(name, requirement)
    if (value !== undefined && !EMAIL_PATTERN.test(value)) {
      throw invalidRequest(`Invalid email address: ${value}`, { code: 'email_invalid', param: this.path(name) })
    }
    return value
  }

  object(name: string, requirement: Requirement = {}): FormParams | undefined {
    const value = this.take(name, requirement)
    if (value === undefined) return undefined
    if (typeof value === 'string') throw invalidRequest('Invalid hash', { param: this.path(name) })
    const child = new FormParams(value, this.path(name))
    this.children.push(child)
    return child
  }

  // A list arrives as an object keyed by index (`line_items[0]`, `line_items[1]`); Stripe orders it by index.
  private indexedEntries(name: string, requirement: Requirement): Array<[string, FormValue]> | undefined {
    const value = this.take(name, requirement)
    if (value === undefined) return undefined
    if (typeof value === 'string' || !Object.keys(value).every((key) => /^\d+$/.test(key))) {
      throw invalidRequest('Invalid array', { param: this.path(name) })
    }
    return Object.entries(value).sort(([a], [b]) => Number(a) - Number(b))
  }

  list(name: string, requirement: Requirement = {}): FormParams[] | undefined {
    const entries = this.indexedEntries(name, requirement)
    if (entries === undefined) return undefined
    return entries.map(([index, entry]) => {
      const path = `${this.path(name)}[${index}]`
      if (typeof entry === 'string') throw invalidRequest('Invalid hash', { param: path })
      const child = new FormParams(entry, path)
      this.children.push(child)
      return child
    })
  }

  stringList(name: string, requirement: Requirement = {}): string[] | undefined {
    const entries = this.indexedEntries(name, requirement)
    if (entries === undefined) return undefined
    return entries.map(([index, entry]) => {
      if (typeof entry !== 'string') throw invalidRequest('Invalid string', { param: `${this.path(name)}[${index}]` })
      return entry
    })
  }

  // Limits from Stripe's metadata documentation (from memory): 50 keys, keys up to 40 characters,
  // values up to 500 characters. An empty value unsets the key, so on create it is left out.
  metadata(name = 'metadata'): Record<string, string> | undefined {
    const value = this.take(name, {})
    if (value === undefined) return this.node[name] === '' ? {} : undefined
    if (typeof value === 'string') throw invalidRequest('Invalid hash', { param: this.path(name) })
    const entries = Object.entries(value)
    if (entries.length > 50) {
      throw invalidRequest('You can specify up to 50 keys.', { param: this.path(name) })
    }
    const metadata: Record<string, string> = {}
    for (const [key, entry] of entries) {
      const path = `${this.path(name)}[${key}]`
      if (typeof entry !== 'string') throw invalidRequest('Invalid string', { param: path })
      if (key.length > 40) {
        throw invalidRequest('Metadata keys can have up to 40 characters.', { param: path })
      }
      if (entry.length > 500) {
        throw invalidRequest(
          `Metadata values can have up to 500 characters, but you passed in a value that is ${entry.length} characters.`,
          { param: path },
        )
      }
      if (entry !== '') metadata[key] = entry
    }
    return metadata
  }

  // Refuses every parameter no reader asked for, as Stripe refuses parameters it does not know.
  finish(): void {
    for (const key of Object.keys(this.node)) {
      if (!this.read.has(key)) {
        throw invalidRequest(`Received unknown parameter: ${this.path(key)}`, {
          code: 'parameter_unknown',
          param: this.path(key),
        })
      }
    }
    for (const child of this.children) child.finish()
  }
}
