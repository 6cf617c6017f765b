// When a Leaflet map was last torn down, so a map mounted right after (a page change) can wait for it.
let lastTeardown = Number.NEGATIVE_INFINITY

/** Notes that a map frame is being torn down now. */
export function noteMapTeardown(): void {
  lastTeardown = performance.now()
}

/** True within a second after a map frame was torn down. */
export function mapJustTornDown(): boolean {
  return performance.now() - lastTeardown < 1000
}
