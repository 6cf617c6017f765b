import { noteMapTeardown } from '../utils/mapTeardown'

/**
 * True once Leaflet's module and its marker images are loaded and the component is still mounted.
 * Mount `<LMap>` behind it: LMap loads Leaflet and the three marker images itself and builds the map
 * afterwards, so a map torn down while any of them was still arriving (a quick tab switch or
 * navigation) finds no container and throws. With all four loaded first, LMap's own loads settle
 * soon after; the browser still settles them in a later task, so a teardown in that short gap can
 * happen, and plugins/leafletTeardown.client.ts lets the errors it causes go.
 */
export function useLeafletReady() {
  const ready = ref(false)
  let mounted = true
  onMounted(async () => {
    await Promise.all([
      import('leaflet'),
      import('leaflet/dist/images/marker-icon-2x.png'),
      import('leaflet/dist/images/marker-icon.png'),
      import('leaflet/dist/images/marker-shadow.png'),
    ])
    if (mounted) ready.value = true
  })
  onBeforeUnmount(() => {
    mounted = false
    noteMapTeardown()
  })
  return ready
}
