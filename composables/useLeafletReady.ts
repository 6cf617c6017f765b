import { noteMapTeardown } from './mapTeardown'

/**
 * True once Leaflet's module and its marker images are loaded and the component is still mounted.
 * Mount `<LMap>` behind it: LMap loads Leaflet and the three marker images itself and builds the map
 * afterwards, so a map torn down while any of them was still arriving (a quick tab switch or
 * navigation) would find no container and throw. With all four already loaded, LMap's own loads
 * settle at once and it builds its map before any further click or navigation can unmount it.
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
