// The `?node-worker` import below has its types in this declaration file; `nuxt typecheck` needs the reference.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference
/// <reference path="../../workers/node-worker.d.ts" />
import { availableParallelism } from 'node:os'
import type { H3Event } from 'h3'
import { Piscina } from 'piscina'
import engineWorkerUrl from '../../workers/engine.worker?node-worker'
import type { EngineOutcome, EngineResults, EngineTask } from '../../workers/engine.worker'

// Engine work (assess, sweep, sensitivity) runs in a pool of worker threads, so a long calculation
// never holds the request thread: other requests, /api/health among them, keep being answered.
// Every run is bounded: a queue limit (503 with Retry-After when full), a time limit counted from
// the request's turn in the queue (503 with Retry-After), and a caller who goes away cancels their
// run. Settings: runtimeConfig.enginePool (NUXT_ENGINE_POOL_*). The worker: workers/engine.worker.ts.

/** How the pool is sized and bounded. */
export interface EnginePoolSettings {
  /** Worker threads. */
  threads: number
  /** Longest a run may take, its wait for a thread included, ms. */
  timeLimitMs: number
  /** Most runs waiting for a thread; past it the route answers 503. */
  queueLimit: number
}

/** Seconds a caller is told to wait when every thread is busy and the queue is full. */
const BUSY_RETRY_AFTER_S = 5
/** Seconds a caller is told to wait after a run passed the time limit. */
const TIME_LIMIT_RETRY_AFTER_S = 30

const positiveOr = (value: unknown, fallback: number) => {
  const n = Number(value)
  return Number.isFinite(n) && n > 0 ? Math.floor(n) : fallback
}

/** The pool settings from runtimeConfig; threads 0 (the default) means one fewer than the machine's cores, at least 1. */
export function enginePoolSettings(config: { threads?: unknown; timeLimitMs?: unknown; queueLimit?: unknown } = useRuntimeConfig().enginePool): EnginePoolSettings {
  return {
    threads: positiveOr(config.threads, Math.max(1, availableParallelism() - 1)),
    timeLimitMs: positiveOr(config.timeLimitMs, 30_000),
    queueLimit: positiveOr(config.queueLimit, 32),
  }
}

let pool: Piscina | undefined
let settings: EnginePoolSettings | undefined

function enginePool(): { pool: Piscina; settings: EnginePoolSettings } {
  if (!pool || !settings) {
    settings = enginePoolSettings()
    pool = new Piscina({
      // Computed here, not at load: the server's own URL is only filled in once it runs.
      filename: engineWorkerUrl(),
      // One thread kept warm (a cold one costs tens of milliseconds); more start under load.
      minThreads: 1,
      maxThreads: settings.threads,
      idleTimeout: 60_000,
      maxQueue: settings.queueLimit,
    })
  }
  return { pool, settings }
}

/** Starts the pool and its first thread (server/plugins/enginePool.ts calls it just after start-up). */
export function warmEnginePool(): void {
  enginePool()
}

/** Stops every thread (on server close). */
export async function closeEnginePool(): Promise<void> {
  const closing = pool
  pool = undefined
  settings = undefined
  await closing?.destroy()
}

function busy(event: H3Event, waiting: number) {
  setResponseHeader(event, 'Retry-After', BUSY_RETRY_AFTER_S)
  return createError({
    statusCode: 503,
    statusMessage: 'Service Unavailable',
    message: `engine: the server is busy with other calculations (${waiting} waiting); try again in ${BUSY_RETRY_AFTER_S} s`,
    data: { retryAfter_s: BUSY_RETRY_AFTER_S },
  })
}

/**
 * 503 with Retry-After when the engine queue is full. Routes call it before reading a large body,
 * so a busy server does not read megabytes it will refuse; `runEngine` checks again.
 */
export function assertEngineRoom(event: H3Event): void {
  const { pool, settings } = enginePool()
  if (pool.queueSize >= settings.queueLimit) throw busy(event, pool.queueSize)
}

/**
 * Runs one engine task in the pool and answers its result. Errors: 400 naming the field (a body the
 * schema refuses, as readValidatedJson answers), 422 naming the field (an input the engine refuses),
 * 503 with Retry-After (queue full, or past the time limit). A caller who goes away cancels the run.
 */
export async function runEngine<K extends EngineTask['kind']>(event: H3Event, task: Extract<EngineTask, { kind: K }>): Promise<EngineResults[K]> {
  const outcome = await runInPool(event, { ...task, answer: 'value' })
  if (!('value' in outcome)) throw new Error('engine worker: answered JSON text where a value was asked for')
  return outcome.value as EngineResults[K]
}

/**
 * As `runEngine`, but answers the result as the route's JSON response, serialised in the worker:
 * for routes that send the engine's result as it is (the stateless engine routes).
 */
export async function respondWithEngine(event: H3Event, task: EngineTask): Promise<string> {
  const outcome = await runInPool(event, { ...task, answer: 'json' })
  if (!('json' in outcome)) throw new Error('engine worker: answered a value where JSON text was asked for')
  setResponseHeader(event, 'Content-Type', 'application/json')
  return outcome.json
}

async function runInPool(event: H3Event, task: EngineTask): Promise<Extract<EngineOutcome, { ok: true }>> {
  const { pool, settings } = enginePool()
  // piscina's own queue-full error carries no code: check first and answer plainly.
  if (pool.queueSize >= settings.queueLimit) throw busy(event, pool.queueSize)

  const timeLimit = AbortSignal.timeout(settings.timeLimitMs)
  const callerGone = new AbortController()
  const res = event.node.res
  // 'close' on the response before it finished means the client went away (the request's own
  // 'close' fires as soon as its body has been read).
  const onClose = () => {
    if (!res.writableFinished) callerGone.abort()
  }
  res.once('close', onClose)
  let outcome: EngineOutcome
  try {
    outcome = (await pool.run(task, { signal: AbortSignal.any([timeLimit, callerGone.signal]) })) as EngineOutcome
  } catch (error) {
    if (timeLimit.aborted) {
      setResponseHeader(event, 'Retry-After', TIME_LIMIT_RETRY_AFTER_S)
      throw createError({
        statusCode: 503,
        statusMessage: 'Service Unavailable',
        message: `engine: the calculation did not finish within the ${(settings.timeLimitMs / 1000).toLocaleString('en-GB')} s time limit (its wait for a free engine included); try a smaller grid or a shorter record, or try again later`,
        data: { retryAfter_s: TIME_LIMIT_RETRY_AFTER_S, timeLimit_s: settings.timeLimitMs / 1000 },
      })
    }
    if (callerGone.signal.aborted) throw createError({ statusCode: 499, statusMessage: 'Client Closed Request', message: 'engine: the request was given up before its answer' })
    if (error instanceof Error && /queue is at limit/i.test(error.message)) throw busy(event, pool.queueSize)
    throw error
  } finally {
    res.off('close', onClose)
  }
  if (outcome.ok) return outcome
  if (outcome.status === 500) throw new Error(`engine worker: ${outcome.message}`)
  throw createError({ statusCode: outcome.status, statusMessage: outcome.statusMessage, message: outcome.message, data: { issues: outcome.issues } })
}
