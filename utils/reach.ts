// A river reach as a line of points: pure editing steps, GeoJSON in and out, lengths and bounds.
/** A point on the map in degrees (WGS 84). */
export interface LatLng {
  lat: number
  lng: number
}

/** A GeoJSON LineString; coordinates are [lng, lat] pairs as GeoJSON orders them. */
export interface ReachLineString {
  type: 'LineString'
  coordinates: [number, number][]
}

const EARTH_RADIUS_m = 6_371_008.8

/** Rounds degrees to 6 decimals (about 0.1 m), enough for screening and stable in forms. */
export function roundDegrees(value: number): number {
  return Math.round(value * 1e6) / 1e6
}

/** A copy of `point` with rounded degrees and longitude wrapped into −180…180. */
export function normalisePoint(point: LatLng): LatLng {
  const lng = ((((point.lng + 180) % 360) + 360) % 360) - 180
  return { lat: roundDegrees(Math.max(-90, Math.min(90, point.lat))), lng: roundDegrees(lng) }
}

/** The vertices with `point` added at the end (the outfall side). */
export function addVertex(vertices: readonly LatLng[], point: LatLng): LatLng[] {
  return [...vertices, normalisePoint(point)]
}

/** The vertices with the one at `index` moved to `point`; an index out of range changes nothing. */
export function moveVertex(vertices: readonly LatLng[], index: number, point: LatLng): LatLng[] {
  if (index < 0 || index >= vertices.length) return [...vertices]
  return vertices.map((v, i) => (i === index ? normalisePoint(point) : v))
}

/** The vertices without the one at `index`. */
export function removeVertex(vertices: readonly LatLng[], index: number): LatLng[] {
  return vertices.filter((_, i) => i !== index)
}

/** The vertices without the last one (Undo last point). */
export function undoLastVertex(vertices: readonly LatLng[]): LatLng[] {
  return vertices.slice(0, -1)
}

/** The reach as GeoJSON, or null when it has fewer than two vertices (not yet a line). */
export function toLineString(vertices: readonly LatLng[]): ReachLineString | null {
  if (vertices.length < 2) return null
  return { type: 'LineString', coordinates: vertices.map((v) => [v.lng, v.lat]) }
}

/** Vertices from a stored GeoJSON LineString (null or malformed gives none). */
export function fromLineString(line: ReachLineString | null | undefined): LatLng[] {
  if (!line || line.type !== 'LineString' || !Array.isArray(line.coordinates)) return []
  return line.coordinates
    .filter((c) => Array.isArray(c) && Number.isFinite(c[0]) && Number.isFinite(c[1]))
    .map(([lng, lat]) => ({ lat, lng }))
}

/** Great-circle distance between two points, m (haversine on a sphere of the mean Earth radius). */
export function distanceMetres(a: LatLng, b: LatLng): number {
  const rad = Math.PI / 180
  const dLat = (b.lat - a.lat) * rad
  const dLng = (b.lng - a.lng) * rad
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLng / 2) ** 2
  return 2 * EARTH_RADIUS_m * Math.asin(Math.min(1, Math.sqrt(h)))
}

/** Length of the reach along its vertices, m. */
export function reachLengthMetres(vertices: readonly LatLng[]): number {
  let total = 0
  for (let i = 1; i < vertices.length; i++) total += distanceMetres(vertices[i - 1]!, vertices[i]!)
  return total
}

/** South-west and north-east corners around the points, as Leaflet's [[lat, lng], [lat, lng]]; null for none. */
export function boundsOf(points: readonly LatLng[]): [[number, number], [number, number]] | null {
  if (!points.length) return null
  let south = Infinity
  let west = Infinity
  let north = -Infinity
  let east = -Infinity
  for (const p of points) {
    south = Math.min(south, p.lat)
    north = Math.max(north, p.lat)
    west = Math.min(west, p.lng)
    east = Math.max(east, p.lng)
  }
  return [
    [south, west],
    [north, east],
  ]
}
