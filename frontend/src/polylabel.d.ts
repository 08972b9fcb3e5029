/** polylabel (npm, Mapbox) ships no types: the pole of inaccessibility of a polygon given as rings of [x, y]. */
declare module 'polylabel' {
  export default function polylabel(polygon: number[][][], precision?: number, debug?: boolean): [number, number] & { distance: number };
}
