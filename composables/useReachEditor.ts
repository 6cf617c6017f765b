// Reach editing on the site map: the reach is an ordered list of vertices from intake to outfall.
// The editing steps are pure (utils/reach.ts); the map component wires this state to the map.
import { computed, ref, type Ref } from 'vue'
import { addVertex, fromLineString, type LatLng, moveVertex, reachLengthMetres, type ReachLineString, removeVertex, toLineString, undoLastVertex } from '../utils/reach'

/**
 * Editing state for a reach: the vertex list, whether map clicks add vertices, and the edits.
 * `onChange` hears every edit as GeoJSON (null while the reach has fewer than two vertices).
 */
export function useReachEditor(initial: Ref<ReachLineString | null | undefined>, onChange: (line: ReachLineString | null) => void) {
  const vertices = ref<LatLng[]>(fromLineString(initial.value))
  const drawing = ref(false)

  function commit(next: LatLng[]) {
    vertices.value = next
    onChange(toLineString(next))
  }

  /** Takes the stored reach again (after a reload from the server). */
  function reset(line: ReachLineString | null | undefined) {
    vertices.value = fromLineString(line)
  }

  return {
    vertices,
    drawing,
    lengthMetres: computed(() => reachLengthMetres(vertices.value)),
    add: (p: LatLng) => commit(addVertex(vertices.value, p)),
    move: (i: number, p: LatLng) => commit(moveVertex(vertices.value, i, p)),
    remove: (i: number) => commit(removeVertex(vertices.value, i)),
    undo: () => commit(undoLastVertex(vertices.value)),
    clear: () => commit([]),
    reset,
  }
}
