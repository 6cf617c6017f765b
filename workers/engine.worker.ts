// The server's engine worker: runs in a piscina worker thread (server/utils/enginePool.ts), never on
// the request thread. Bundled by build/nodeWorker.ts into one self-contained .mjs, so it imports only
// pure code: shared/ and the zod validator. (workers/sweep.worker.ts is the browser's Web Worker.)
// Stateless routes post the body as raw JSON text, parsed and checked here (posting a parsed
// 80,000-day object costs the request thread far more than the text); stored-option routes post the
// input they built from the database; the hydrology tab posts a site's stored days. Failures come back as values: an Error loses its class and
// fields across the thread boundary.
import { assess, assessWithUncertainty } from '../shared/engine/assess'
import { commissioningCheck, type CommissioningMeasurement, type CommissioningResult } from '../shared/engine/commissioning'
import { ENGINE_VERSION } from '../shared/engine/version'
import type { AssessResult } from '../shared/engine/results'
import { EngineInputError } from '../shared/engine/errors'
import { fdcFromRecord, fdcStats, monthlyFdcs, reservedFlow, type DailyFlow, type ReservedFlowSetting } from '../shared/engine/hydrology'
import { sensitivity, type SensitivityResult } from '../shared/engine/sensitivity'
import { sweep, withDesign, type SweepResult } from '../shared/engine/sweep'
import { AssessInputSchema, type AssessInput, type SweepGrid } from '../shared/schemas/assess'
import { SensitivityRequestSchema, SweepRequestSchema } from '../shared/schemas/engineRequests'
import type { HydrologyDto } from '../shared/schemas/flowRecord'
import { fdcChartPoints } from '../shared/utils/fdcChart'
import { InputError, validator } from '../server/utils/validate'
import { parseSafeJson } from '../shared/utils/safeJson'

/**
 * One piece of engine work. `body` is a request body as received (undefined when there was none);
 * with `answer: 'json'` the result comes back as JSON text, ready to send, so the request thread
 * neither copies nor serialises it.
 */
export type EngineTask = (

  | { kind: 'assess'; body: string | undefined }
  | { kind: 'sweep'; body: string | undefined }
  | { kind: 'sensitivity'; body: string | undefined }
  | { kind: 'assess-input'; input: AssessInput }
  | { kind: 'sweep-input'; input: AssessInput; grid: SweepGrid }
  | { kind: 'design-at'; input: AssessInput; throatDiameter_m: number; units: number; throatDepth_m: number }
  | { kind: 'record-hydrology'; days: DailyFlow[]; reservedFlow: ReservedFlowSetting }
  | { kind: 'commissioning-check'; input: AssessInput; measurement: CommissioningMeasurement }
) & { answer?: 'value' | 'json' }

/** What each kind of task answers. */
export interface EngineResults {
  'assess': AssessResult
  'sweep': SweepResult
  'sensitivity': SensitivityResult
  'assess-input': AssessResult
  'sweep-input': SweepResult
  /** The option's design moved to that grid point (as the sweep moves it). */
  'design-at': AssessInput['option']
  /** A site's stored record as the hydrology tab shows it: its curve for charting, statistics, months, reserved flow. */
  'record-hydrology': Pick<HydrologyDto, 'points' | 'stats' | 'monthly' | 'count'> & { reservedFlow: number }
  /** A commissioning measurement against a stored assessment's input: the engine's state at that one flow, with this engine's version. */
  'commissioning-check': CommissioningResult & { engineVersion: string }
}

/** A field and what is wrong with it. */
export interface FieldIssue {
  path: string
  message: string
}

/** A task's answer: its value, or why not (400: the body or a field the schema refuses; 422: the engine refuses a field; 500: a fault). */
export type EngineOutcome<T = unknown> =
  | { ok: true; value: T }
  | { ok: true; json: string }
  | { ok: false; status: 400 | 422; statusMessage: string; message: string; issues: FieldIssue[] }
  | { ok: false; status: 500; message: string }

class BrokenJson extends Error {}

function parseBody(text: string | undefined): unknown {
  if (text === undefined) return undefined
  try {
    return parseSafeJson(text)
  } catch {
    throw new BrokenJson('body: is not valid JSON, or holds a key such as "__proto__" or "constructor" that is refused')
  }
}

/**
 * Runs `work` on the engine input found at `prefix` in the request body: a field the engine refuses
 * is named by its path in the body (`input.option.units`), as the schema names the fields it refuses.
 */
function inBody<T>(prefix: string, work: () => T): T {
  try {
    return work()
  } catch (error) {
    if (error instanceof EngineInputError) throw new EngineInputError(`${prefix}${error.field}`, error.message)
    throw error
  }
}

/** Whether a raw assess body sets settings.monteCarloDraws itself. */
function asksForDraws(raw: unknown): boolean {
  const settings = (raw as { settings?: unknown } | null)?.settings
  return typeof settings === 'object' && settings !== null && 'monteCarloDraws' in settings
}

function compute(task: EngineTask): EngineResults[EngineTask['kind']] {
  switch (task.kind) {
    case 'assess': {
      // The stateless route runs the Monte Carlo only when the body asks for draws.
      const raw = parseBody(task.body)
      const input = validator(AssessInputSchema, 'body')(raw)
      return asksForDraws(raw) ? assessWithUncertainty(input) : assess(input)
    }
    case 'sweep': {
      const { input, grid } = validator(SweepRequestSchema, 'body')(parseBody(task.body))
      return inBody('input.', () => sweep(input, grid))
    }
    case 'sensitivity': {
      const { input, fraction } = validator(SensitivityRequestSchema, 'body')(parseBody(task.body))
      return inBody('input.', () => sensitivity(input, fraction))
    }
    case 'assess-input':
      return assessWithUncertainty(task.input)
    case 'sweep-input':
      return sweep(task.input, task.grid)
    case 'design-at':
      return withDesign(task.input, task.throatDiameter_m, task.units, task.throatDepth_m).option
    case 'commissioning-check':
      return { ...commissioningCheck(task.input, task.measurement), engineVersion: ENGINE_VERSION }
    case 'record-hydrology': {
      const fdc = fdcFromRecord(task.days)
      const counts = new Array<number>(12).fill(0)
      for (const d of task.days) if (d.flow !== null) counts[Number(d.date.slice(5, 7)) - 1]! += 1
      return {
        points: fdcChartPoints(fdc),
        stats: fdcStats(fdc),
        monthly: monthlyFdcs(task.days).map((m, k) => ({ month: k + 1, days: counts[k]!, stats: m ? fdcStats(m) : null })),
        reservedFlow: reservedFlow(task.reservedFlow, fdc),
        count: fdc.count,
      }
    }
  }
}

/** Runs one task (piscina calls the default export), answering a value or why not, never throwing. */
export default function runEngineTask(task: EngineTask): EngineOutcome {
  try {
    const value = compute(task)
    return task.answer === 'json' ? { ok: true, json: JSON.stringify(value) } : { ok: true, value }
  } catch (error) {
    // The same answers as server/utils/body.ts (broken JSON) and readValidatedJson (a refused field).
    if (error instanceof BrokenJson) return { ok: false, status: 400, statusMessage: 'Bad Request', message: error.message, issues: [{ path: 'body', message: error.message.slice('body: '.length) }] }
    if (error instanceof InputError) return { ok: false, status: 400, statusMessage: 'Validation Error', message: error.message, issues: error.issues }
    if (error instanceof EngineInputError) return { ok: false, status: 422, statusMessage: 'Unprocessable Entity', message: `${error.field}: ${error.message}`, issues: [{ path: error.field, message: error.message }] }
    return { ok: false, status: 500, message: error instanceof Error ? `${error.name}: ${error.message}` : String(error) }
  }
}
