/**
 * True once Leaflet's module is loaded and the component is still mounted. Mount `<LMap>` behind it:
 * LMap loads Leaflet itself and builds the map afterwards, so a map torn down while the module was
 * still arriving (a quick tab switch or navigation) would find no container and throw. With the
 * module already loaded, LMap builds its map before any further click or navigation can unmount it.
 */
export function useLeafletReady() {
  const ready = ref(false)
  let mounted = true
  onMounted(async () => {
    await import('leaflet')
    if (mounted) ready.value = true
  })
  onBeforeUnmount(() => {
    mounted = false
  })
  return ready
}
