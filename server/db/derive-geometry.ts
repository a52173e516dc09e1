/**
 * Figures derived from a subpopulation's boundary, stored beside it so lists and maps need not
 * recompute them: the centroid (longitude, latitude in degrees, WGS 84) and the geodesic area
 * in km². Seeds and the API both use this, so stored figures agree however a record was made.
 */
import { area, centerOfMass } from '@turf/turf'
import type { SubpopulationGeometry } from './models/Subpopulation'

export interface GeometryFigures {
  centroidLon: number
  centroidLat: number
  /** Geodesic area in km² (0 for a point). */
  areaKm2: number
}

const round = (value: number, digits: number): number => Number(value.toFixed(digits))

/**
 * Centroid and area of a Polygon, MultiPolygon or Point.
 *
 * The centroid is the centre of mass of the shape (turf `centerOfMass`), which for a concave
 * outline can fall outside it; the area is turf's spherical area (earth radius 6 371 008.8 m)
 * divided by 10^6. Rounded to 1e-6 degrees (about 0.1 m) and 1e-4 km² (100 m²).
 *
 * @param geometry - GeoJSON geometry in lon/lat degrees
 * @returns centroid and area
 * @example deriveGeometryFigures({ type: 'Point', coordinates: [-82.5, 35.6] }) // { centroidLon: -82.5, centroidLat: 35.6, areaKm2: 0 }
 */
export function deriveGeometryFigures(geometry: SubpopulationGeometry): GeometryFigures {
  if (geometry.type === 'Point') {
    const [lon = 0, lat = 0] = geometry.coordinates
    return { centroidLon: lon, centroidLat: lat, areaKm2: 0 }
  }
  const [lon = 0, lat = 0] = centerOfMass(geometry).geometry.coordinates
  return {
    centroidLon: round(lon, 6),
    centroidLat: round(lat, 6),
    areaKm2: round(area(geometry) / 1e6, 4),
  }
}
