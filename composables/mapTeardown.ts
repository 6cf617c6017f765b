// When a map frame was last torn down, for plugins/leafletTeardown.client.ts. Kept apart from
// useLeafletReady.ts so the plugin, which every page loads, does not pull in that file's dynamic
// imports of Leaflet (the browser would fetch Leaflet ahead on pages without a map).
let lastTeardown = Number.NEGATIVE_INFINITY

/** Notes that a map frame is being torn down now. */
export function noteMapTeardown(): void {
  lastTeardown = performance.now()
}

/** True within a second after a map frame was torn down. */
export function mapJustTornDown(): boolean {
  return performance.now() - lastTeardown < 1000
}
