// Reading JSON sent by a stranger: the text parsed, refusing any `__proto__`, `constructor` or
// `prototype` key (it could reach an object's prototype when the value is copied). One rule for the
// request thread (server/utils/body.ts) and the engine's worker threads (workers/engine.worker.ts).

/** Keys refused anywhere in a JSON body. */
const UNSAFE_KEYS = new Set(['__proto__', 'constructor', 'prototype'])

/** The parsed value; throws when the text is not JSON or holds a refused key. */
export function parseSafeJson(text: string): unknown {
  return JSON.parse(text, (key, value: unknown) => {
    if (UNSAFE_KEYS.has(key)) throw new Error(`the key "${key}" is refused`)
    return value
  })
}
