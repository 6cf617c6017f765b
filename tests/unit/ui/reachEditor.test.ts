import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useReachEditor } from '../../../composables/useReachEditor'
import { addVertex, boundsOf, distanceMetres, fromLineString, moveVertex, normalisePoint, reachLengthMetres, type ReachLineString, removeVertex, toLineString, undoLastVertex } from '../../../utils/reach'
import { ReachSchema } from '../../../shared/schemas/site'

const A = { lat: 54.5, lng: -2.6 }
const B = { lat: 54.501, lng: -2.601 }
const C = { lat: 54.502, lng: -2.599 }

describe('reach vertex helpers', () => {
  it('adds at the end, undoes the last, removes and moves by index without touching the input', () => {
    const one = addVertex([], A)
    const three = addVertex(addVertex(one, B), C)
    expect(three).toEqual([A, B, C])
    expect(one).toEqual([A])
    expect(undoLastVertex(three)).toEqual([A, B])
    expect(undoLastVertex([])).toEqual([])
    expect(removeVertex(three, 1)).toEqual([A, C])
    expect(moveVertex(three, 0, { lat: 1, lng: 2 })).toEqual([{ lat: 1, lng: 2 }, B, C])
    expect(moveVertex(three, 5, { lat: 1, lng: 2 })).toEqual(three)
    expect(three).toEqual([A, B, C])
  })

  it('rounds to 6 decimals and wraps longitude into −180…180', () => {
    expect(normalisePoint({ lat: 54.12345678, lng: 181 })).toEqual({ lat: 54.123457, lng: -179 })
    expect(normalisePoint({ lat: 95, lng: -190 })).toEqual({ lat: 90, lng: 170 })
  })

  it('writes GeoJSON with [lng, lat] order and reads it back; fewer than two points is no line', () => {
    expect(toLineString([A])).toBeNull()
    const line = toLineString([A, B])!
    expect(line).toEqual({ type: 'LineString', coordinates: [[-2.6, 54.5], [-2.601, 54.501]] })
    expect(ReachSchema.safeParse(line).success).toBe(true)
    expect(fromLineString(line)).toEqual([A, B])
    expect(fromLineString(null)).toEqual([])
    expect(fromLineString({ type: 'Point', coordinates: [] } as unknown as ReachLineString)).toEqual([])
  })

  it('measures length along the vertices', () => {
    // One degree of latitude on the mean-radius sphere is 2πR/360 ≈ 111,195 m (common practice, no source).
    expect(distanceMetres({ lat: 0, lng: 0 }, { lat: 1, lng: 0 })).toBeCloseTo(111_195, -1)
    expect(reachLengthMetres([A])).toBe(0)
    expect(reachLengthMetres([A, B, C])).toBeCloseTo(distanceMetres(A, B) + distanceMetres(B, C), 6)
  })

  it('gives south-west and north-east corners', () => {
    expect(boundsOf([])).toBeNull()
    expect(boundsOf([A, B, C])).toEqual([[54.5, -2.601], [54.502, -2.599]])
  })
})

describe('useReachEditor', () => {
  it('reports every edit as GeoJSON, and null once the reach drops below two points', () => {
    const heard: (ReachLineString | null)[] = []
    const editor = useReachEditor(ref(null), (line) => heard.push(line))
    editor.add(A)
    editor.add(B)
    editor.add(C)
    expect(heard.at(-1)?.coordinates).toHaveLength(3)
    editor.undo()
    expect(heard.at(-1)?.coordinates).toEqual([[-2.6, 54.5], [-2.601, 54.501]])
    editor.undo()
    expect(heard.at(-1)).toBeNull()
    expect(editor.vertices.value).toEqual([A])
    editor.add(B)
    editor.clear()
    expect(editor.vertices.value).toEqual([])
    expect(heard.at(-1)).toBeNull()
  })

  it('starts from the stored reach and takes a new one on reset', () => {
    const editor = useReachEditor(ref({ type: 'LineString', coordinates: [[-2.6, 54.5], [-2.601, 54.501]] }), () => {})
    expect(editor.vertices.value).toEqual([A, B])
    expect(editor.lengthMetres.value).toBeGreaterThan(100)
    editor.move(1, C)
    expect(editor.vertices.value[1]).toEqual(C)
    editor.reset(null)
    expect(editor.vertices.value).toEqual([])
  })
})
