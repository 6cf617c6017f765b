import type { ChildProcess } from 'node:child_process'

/** .output/server/index.mjs below the current folder. */
export declare const SERVER_ENTRY: string

export interface BuiltServerOptions {
  /** The server's entry file (default SERVER_ENTRY), e.g. a copy of .output taken under the build lock. */
  entry?: string
  /** Folder for the database and uploads, kept on close; when absent, a fresh temporary folder removed on close. Give the same folder again to restart on the same file. */
  dir?: string
  /** Name prefix of the temporary folder. */
  prefix?: string
  /** SQLite file to serve (default: `gillwatt.sqlite` in the folder). */
  databasePath?: string
  /** Uploads folder (default: `uploads` in the folder). */
  uploadsDir?: string
  /** Load the demo scenario (`db/cli.ts seed`, as `npm run db:seed`) before starting. */
  seed?: boolean
  /** NUXT_SESSION_PASSWORD (32 characters or more). */
  sessionPassword?: string
  /** More environment, applied last over the defaults (NUXT_PUBLIC_APP_URL = baseURL, no tiles, no SMTP); undefined leaves a variable out. */
  env?: Record<string, string | undefined>
  /** Run the server in a process group of its own (default false), so `stop()` reaches whatever it starts and a terminal's Ctrl+C does not. */
  detached?: boolean
  /** Called as soon as the process exists, before it answers: e.g. to stop it on Ctrl+C while it starts. */
  onSpawn?: (child: ChildProcess) => void
  /** How long to wait for /api/health (default 30 s). */
  healthTimeoutMs?: number
}

export interface BuiltServer {
  /** http://127.0.0.1:<port> */
  baseURL: string
  port: number
  /** The folder given, or the temporary one. */
  dir: string
  databasePath: string
  uploadsDir: string
  /** The server process, e.g. for `child.kill('SIGKILL')`. */
  child: ChildProcess
  /** Everything the server printed so far. */
  output(): string
  /** SIGTERM (to its group when detached), then SIGKILL after 5 s. */
  stop(): Promise<void>
  /** Stops the server and removes its temporary folder (not a folder given as `dir`). */
  close(): Promise<void>
}

/** A TCP port free on 127.0.0.1 right now. */
export declare function freePort(): Promise<number>
/** SIGTERM to the child (and its group when it leads one), SIGKILL after `graceMs` (default 5000). */
export declare function stopProcess(child: ChildProcess, graceMs?: number): Promise<void>
/** Starts the built server and resolves once /api/health answers; throws with its output if it exits or never answers. */
export declare function startBuiltServer(options?: BuiltServerOptions): Promise<BuiltServer>
