// Written by the build (build/basemap/plugin.ts): where the basemap's files are and which exist.
declare module 'virtual:conewright-basemap' {
  const index: import('./basemap-grid').BasemapIndex
  export default index
}
