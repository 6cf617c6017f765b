// The map tile source from runtime config (the maps' other shared settings are in utils/map.ts).
/** The tile URL and credit from runtime config; `url` is '' when none is configured (no tile layer then). */
export function useMapTiles() {
  const config = useRuntimeConfig().public
  return {
    url: String(config.mapTilesUrl ?? '').trim(),
    attribution: String(config.mapTilesAttribution ?? ''),
  }
}
