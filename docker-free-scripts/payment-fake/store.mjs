// In-memory objects of the local payment service, shaped like the hosted service's API objects.
// They live as long as this process: the API may restart freely, its payments stay here.
import { randomBytes } from 'node:crypto';

export const now = () => Math.floor(Date.now() / 1000);
export const newId = (prefix) => `${prefix}_${randomBytes(12).toString('hex')}`;

/** One collection per object type, in creation order. */
export function createStore() {
  const tables = new Map();
  const table = (name) => {
    if (!tables.has(name)) tables.set(name, new Map());
    return tables.get(name);
  };
  return {
    put(name, obj) {
      table(name).set(obj.id, obj);
      return obj;
    },
    get(name, id) {
      return table(name).get(id);
    },
    all(name) {
      return [...table(name).values()];
    },
  };
}

/** Wire-format error: `{ error: { type, message, code, param } }` with its HTTP status. */
export class WireError extends Error {
  constructor(status, message, { type = 'invalid_request_error', code, param } = {}) {
    super(message);
    this.status = status;
    this.body = { error: { type, message, ...(code ? { code } : {}), ...(param ? { param } : {}) } };
  }
}

export const missing = (what, id) => new WireError(404, `No such ${what}: '${id}'`, { code: 'resource_missing', param: 'id' });

/** Form fields arrive as strings: a whole number or a clear 400 naming the field. */
export function wholeNumber(value, param, { min = 0 } = {}) {
  const n = Number(value);
  if (value === undefined || value === '' || !Number.isInteger(n) || n < min) {
    throw new WireError(400, `Invalid integer: ${value}`, { code: 'parameter_invalid_integer', param });
  }
  return n;
}

export function required(value, param) {
  if (value === undefined || value === '') throw new WireError(400, `Missing required param: ${param}.`, { code: 'parameter_missing', param });
  return value;
}

export const bool = (value, fallback) => (value === undefined ? fallback : value === true || value === 'true');

/** Metadata as the hosted service keeps it: string values; an empty string removes a key. */
export function mergeMetadata(current, update) {
  if (update === undefined) return current;
  if (update === '') return {};
  const out = { ...current };
  for (const [k, v] of Object.entries(update)) {
    if (v === '') delete out[k];
    else out[k] = String(v);
  }
  return out;
}

/** A list answer: `{ object: 'list', data, has_more, url }` with `limit` and `starting_after`. */
export function list(items, query, url) {
  const limit = Math.min(Math.max(Number(query.limit ?? 10) || 10, 1), 100);
  let start = 0;
  if (query.starting_after) start = items.findIndex((i) => i.id === query.starting_after) + 1;
  const data = items.slice(start, start + limit);
  return { object: 'list', data, has_more: start + limit < items.length, url };
}
