// Leaflet ships no types and Gillwatt calls it only through @vue-leaflet/vue-leaflet; this lets the
// map components preload the module (composables/useLeafletReady.ts) without pulling in @types.
declare module 'leaflet'
