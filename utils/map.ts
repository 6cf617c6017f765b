// The maps' shared settings and shapes: where a map starts, its colours, what a map component exposes.
import type { LatLng, ReachLineString } from './reach'

/** Where a map with nothing on it starts, and at which zoom. */
export const MAP_START = { center: [54.45, -2.6] as [number, number], zoom: 6 }

/** Zoom used when fitting a single point. */
export const MAP_POINT_ZOOM = 16

/** Path colours for Leaflet (hex of the Tailwind palette in tailwind.config.ts). */
export const MAP_COLOURS = {
  reach: '#2c878d', // gill-500
  reachDrawing: '#77871c', // lichen-600
  siteStroke: '#1f565b', // gill-700
  siteFill: '#bccd45', // lichen-400
  otherSiteFill: '#74c3c6', // gill-300
} as const

/** A Leaflet map, narrowed to the calls Gillwatt makes (the package ships no types of its own here). */
export interface MapHandle {
  fitBounds(bounds: [[number, number], [number, number]], options?: { padding?: [number, number]; maxZoom?: number }): void
  setView(center: [number, number], zoom: number): void
  invalidateSize(): void
}

/** The part of a Leaflet mouse event the maps read. */
export interface MapPointerEvent {
  latlng: LatLng
}

/** What the sites map needs to know of one site. */
export interface MapSite {
  id: number
  name: string
  river?: string | null
  location: LatLng | null
  reach?: ReachLineString | null
}
