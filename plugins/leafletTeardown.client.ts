// The map components of @vue-leaflet/vue-leaflet finish mounting after an await (they load Leaflet
// and its marker images with dynamic imports, which Chromium settles in a later task). When a tab
// switch or a navigation unmounts one in that gap, it then reaches for an element that is gone and
// throws ("Map container not found", "MutationObserver … not of type 'Node'"). Such an error comes
// from a component already unmounted, so nothing on screen is affected: it is dropped here.
// A layer whose own mounting had not finished throws again as it is unmounted with its map. And a
// map torn down while one of its debounced event handlers waits rejects that handler's
// promise with no reason, which nobody awaits: such a rejection within a second of a map teardown
// is dropped too.
//
// Every other error is handled as before: during the first render by Nuxt's own handler (which shows
// the error page), afterwards logged to the console, as Vue does when an app sets no handler.
import type { ComponentPublicInstance } from 'vue'
import { mapJustTornDown } from '~/utils/mapTeardown'

/** Names of the vue-leaflet layer components (LMarker, LIcon, LPolyline, LControlScale …; LMap has none). */
const LEAFLET_COMPONENT = /^L[A-Z][A-Za-z]+$/

/**
 * True for an error thrown by a vue-leaflet layer within a second of a map frame's teardown (while
 * it is being unmounted with it, or after), or by any component already unmounted in that second
 * (LMap itself carries no name), or by a vue-leaflet layer already unmounted.
 */
export function isLeafletTeardownError(instance: ComponentPublicInstance | null): boolean {
  if (!instance) return false
  const layer = LEAFLET_COMPONENT.test(instance.$options.name ?? '')
  return mapJustTornDown() ? layer || instance.$.isUnmounted : layer && instance.$.isUnmounted
}

export default defineNuxtPlugin((nuxtApp) => {
  const nuxtFirstRender = nuxtApp.vueApp.config.errorHandler
  let firstRender = true
  nuxtApp.hook('app:suspense:resolve', () => {
    firstRender = false
  })
  nuxtApp.vueApp.config.errorHandler = (error, instance, info) => {
    if (isLeafletTeardownError(instance)) return
    if (firstRender && nuxtFirstRender) return nuxtFirstRender(error, instance, info)
    console.error(error)
  }
  window.addEventListener('unhandledrejection', (event) => {
    if (event.reason === undefined && mapJustTornDown()) event.preventDefault()
  })
})
