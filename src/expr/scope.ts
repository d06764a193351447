/** A ready-made Scope over a fixed set of bindings. */
import { baseFunctions } from './functions.js';
import type { ExprFunction, Scope, Value } from './types.js';

/**
 * A scope reading `bindings` (own properties only, or a Map) and calling `functions`
 * (`baseFunctions` by default).
 */
export function makeScope(
  bindings: Readonly<Record<string, Value>> | ReadonlyMap<string, Value>,
  functions: Readonly<Record<string, ExprFunction>> = baseFunctions,
): Scope {
  if (bindings instanceof Map) {
    const map = bindings as ReadonlyMap<string, Value>;
    return { lookup: (name) => map.get(name), functions, listNames: () => map.keys() };
  }
  const record = bindings as Readonly<Record<string, Value>>;
  return {
    lookup: (name) => (Object.hasOwn(record, name) ? record[name] : undefined),
    functions,
    listNames: () => Object.keys(record),
  };
}
