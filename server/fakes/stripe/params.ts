/**
 * Reading form-encoded API parameters the way the real API does: unknown parameters, missing
 * required ones, bad integers and empty strings are each refused with the real error shape
 * (`invalid_request_error`, a `code` and the bracketed `param` path), so a typo in the app fails
 * here instead of being silently ignored.
 */

export interface ApiErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';
  code?: string;
  decline_code?: string;
  message: string;
  param?: string;
  charge?: string;
  payment_intent?: unknown;
}

/** Thrown by handlers; the error middleware turns it into `{ error: body }` with the status. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
}

export function invalidRequest(message: string, extra: { code?: string; param?: string } = {}): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', ...extra, message });
}

export function noSuch(objectName: string, id: string, param = 'id'): ApiError {
  return new ApiError(404, {
    type: 'invalid_request_error',
    code: 'resource_missing',
    param,
    message: `No such ${objectName}: '${id}'`,
  });
}

/** What the API answers for a balance transaction a test asked the fake to refuse (`/_fake/fees/refuse`): an outage, not a missing object. */
export function feeLookupRefused(id: string): ApiError {
  return new ApiError(500, { type: 'api_error', message: `The local card fake refuses to show balance transaction ${id} (asked to through /_fake/fees/refuse).` });
}

type Raw = Record<string, unknown>;

function isPlainObject(v: unknown): v is Raw {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** "a, b, or c" */
function oneOf(values: readonly string[]): string {
  if (values.length < 2) return values.join('');
  return `${values.slice(0, -1).join(', ')}, or ${values[values.length - 1]}`;
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export class Params {
  constructor(
    private readonly raw: Raw,
    private readonly prefix = '',
  ) {}

  static of(value: unknown): Params {
    return new Params(isPlainObject(value) ? value : {});
  }

  name(key: string): string {
    return this.prefix ? `${this.prefix}[${key}]` : key;
  }

  has(key: string): boolean {
    return this.raw[key] !== undefined;
  }

  /** Refuses any parameter not in `allowed`, as the real API does. */
  only(allowed: readonly string[]): this {
    for (const key of Object.keys(this.raw)) {
      if (!allowed.includes(key)) {
        throw invalidRequest(`Received unknown parameter: ${this.name(key)}`, {
          code: 'parameter_unknown',
          param: this.name(key),
        });
      }
    }
    return this;
  }

  private missing(key: string): ApiError {
    return invalidRequest(`Missing required param: ${this.name(key)}.`, { code: 'parameter_missing', param: this.name(key) });
  }

  private empty(key: string): ApiError {
    const n = this.name(key);
    return invalidRequest(
      `You passed an empty string for '${n}'. We assume empty values are an attempt to unset a parameter; ` +
        `however '${n}' cannot be unset. You should remove '${n}' from your request or supply a non-empty value.`,
      { code: 'parameter_invalid_empty', param: n },
    );
  }

  string(key: string, opts: { required: true; max?: number }): string;
  string(key: string, opts?: { required?: boolean; max?: number }): string | undefined;
  string(key: string, opts: { required?: boolean; max?: number } = {}): string | undefined {
    const v = this.raw[key];
    if (v === undefined) {
      if (opts.required) throw this.missing(key);
      return undefined;
    }
    if (typeof v !== 'string') {
      throw invalidRequest(`Invalid string: ${this.name(key)} must be a string.`, { param: this.name(key) });
    }
    if (v === '') {
      if (opts.required) throw this.empty(key);
      return undefined;
    }
    if (opts.max !== undefined && v.length > opts.max) {
      throw invalidRequest(`Invalid string: ${this.name(key)} must be at most ${opts.max} characters long.`, {
        param: this.name(key),
      });
    }
    return v;
  }

  integer(key: string, opts: { required: true; min?: number; max?: number }): number;
  integer(key: string, opts?: { required?: boolean; min?: number; max?: number }): number | undefined;
  integer(key: string, opts: { required?: boolean; min?: number; max?: number } = {}): number | undefined {
    const v = this.string(key, { required: opts.required });
    if (v === undefined) return undefined;
    if (!/^-?\d+$/.test(v) || !Number.isSafeInteger(Number(v))) {
      throw invalidRequest(`Invalid integer: ${v}`, { code: 'parameter_invalid_integer', param: this.name(key) });
    }
    const n = Number(v);
    if (opts.min !== undefined && n < opts.min) {
      throw invalidRequest(`This value must be greater than or equal to ${opts.min}.`, {
        code: 'parameter_invalid_integer',
        param: this.name(key),
      });
    }
    if (opts.max !== undefined && n > opts.max) {
      throw invalidRequest(`This value must be less than or equal to ${opts.max}.`, {
        code: 'parameter_invalid_integer',
        param: this.name(key),
      });
    }
    return n;
  }

  boolean(key: string): boolean | undefined {
    const v = this.string(key);
    if (v === undefined) return undefined;
    if (v !== 'true' && v !== 'false') throw invalidRequest(`Invalid boolean: ${v}`, { param: this.name(key) });
    return v === 'true';
  }

  enum<T extends string>(key: string, values: readonly T[], opts: { required: true }): T;
  enum<T extends string>(key: string, values: readonly T[], opts?: { required?: boolean }): T | undefined;
  enum<T extends string>(key: string, values: readonly T[], opts: { required?: boolean } = {}): T | undefined {
    const v = this.string(key, opts);
    if (v === undefined) return undefined;
    if (!values.includes(v as T)) {
      throw invalidRequest(`Invalid ${this.name(key)}: must be one of ${oneOf(values)}`, { param: this.name(key) });
    }
    return v as T;
  }

  url(key: string, opts: { required?: boolean } = {}): string | undefined {
    const v = this.string(key, { ...opts, max: 5000 });
    if (v === undefined) return undefined;
    let ok = false;
    try {
      const u = new URL(v.replace(/\{CHECKOUT_SESSION_ID\}/g, 'x'));
      ok = u.protocol === 'http:' || u.protocol === 'https:';
    } catch {
      ok = false;
    }
    if (!ok) throw invalidRequest('Not a valid URL', { code: 'url_invalid', param: this.name(key) });
    return v;
  }

  email(key: string): string | undefined {
    const v = this.string(key, { max: 800 });
    if (v === undefined) return undefined;
    if (!EMAIL.test(v)) throw invalidRequest(`Invalid email address: ${v}`, { code: 'email_invalid', param: this.name(key) });
    return v;
  }

  object(key: string, opts: { required: true }): Params;
  object(key: string, opts?: { required?: boolean }): Params | undefined;
  object(key: string, opts: { required?: boolean } = {}): Params | undefined {
    const v = this.raw[key];
    if (v === undefined || v === '') {
      if (opts.required) throw this.missing(key);
      return undefined;
    }
    if (!isPlainObject(v)) throw invalidRequest(`Invalid object`, { param: this.name(key) });
    return new Params(v, this.name(key));
  }

  /** `key[0][...]`, `key[1][...]`: a list of objects. Index order, whatever order they came in. */
  objectList(key: string, opts: { required?: boolean } = {}): Params[] {
    const items = this.listValues(key, opts);
    return items.map(([index, v]) => {
      if (!isPlainObject(v)) throw invalidRequest('Invalid object', { param: `${this.name(key)}[${index}]` });
      return new Params(v, `${this.name(key)}[${index}]`);
    });
  }

  /** `key[0]=a&key[1]=b` (or `key[]=a`): a list of strings. */
  stringList(key: string): string[] {
    return this.listValues(key, {}).map(([index, v]) => {
      if (typeof v !== 'string') throw invalidRequest('Invalid array', { param: `${this.name(key)}[${index}]` });
      return v;
    });
  }

  private listValues(key: string, opts: { required?: boolean }): Array<[string, unknown]> {
    const v = this.raw[key];
    if (v === undefined || v === '') {
      if (opts.required) throw this.missing(key);
      return [];
    }
    if (Array.isArray(v)) return v.map((item, i) => [String(i), item]);
    if (typeof v === 'string') return [['0', v]];
    if (isPlainObject(v) && Object.keys(v).every((k) => /^\d+$/.test(k))) {
      return Object.keys(v)
        .sort((a, b) => Number(a) - Number(b))
        .map((k) => [k, v[k]]);
    }
    throw invalidRequest('Invalid array', { param: this.name(key) });
  }

  /**
   * Metadata as the real API takes it: string values, an empty value unsets the key, at most
   * 50 keys of up to 40 characters with values of up to 500.
   */
  metadata(key = 'metadata'): Record<string, string> | undefined {
    const v = this.raw[key];
    if (v === undefined) return undefined;
    if (v === '') return {};
    if (!isPlainObject(v)) throw invalidRequest('Invalid object', { param: this.name(key) });
    const out: Record<string, string> = {};
    for (const [k, value] of Object.entries(v)) {
      const param = `${this.name(key)}[${k}]`;
      if (typeof value !== 'string') throw invalidRequest('Invalid string: metadata values must be strings.', { param });
      if (k.length > 40) throw invalidRequest('Metadata keys can have a maximum length of 40 characters.', { param });
      if (value.length > 500) throw invalidRequest('Metadata values can have a maximum length of 500 characters.', { param });
      if (value !== '') out[k] = value;
    }
    if (Object.keys(out).length > 50) {
      throw invalidRequest('Metadata can have a maximum of 50 keys.', { param: this.name(key) });
    }
    return out;
  }
}
