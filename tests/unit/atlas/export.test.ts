/**
 * Exports (shared/atlas/export.ts) and that they import again (shared/atlas/import-*.ts).
 */
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { CSV_EXPORT_COLUMNS, exportFileName, subpopulationsToCsv, subpopulationsToGeoJson } from '../../../shared/atlas/export'
import { readCsvImport } from '../../../shared/atlas/import-csv'
import { readGeoJsonImport } from '../../../shared/atlas/import-geojson'
import { syntheticRecords } from './synthetic-records'

const records = syntheticRecords(25, 3)
records[0] = { ...records[0]!, name: '=HYPERLINK("x")', notes: 'Line one\nline two, with a comma' }
records[1] = { ...records[1]!, geometry: null, centroid: null, areaKm2: null }

describe('GeoJSON export', () => {
  it('writes every record as a feature with attributes and status, and imports again', () => {
    const collection = subpopulationsToGeoJson(records)
    expect(collection.features).toHaveLength(25)
    expect(collection.features[1]?.geometry).toBeNull()
    expect(collection.features[2]?.properties).toMatchObject({ id: records[2]!.id, name: records[2]!.name, status: records[2]!.status.label, projectionGenerations: 10 })
    const withGeometry = { ...collection, features: collection.features.filter(f => f.geometry !== null) }
    const reading = readGeoJsonImport(JSON.stringify(withGeometry))
    expect(reading.issues).toEqual([])
    expect(reading.records.map(r => r.name)).toEqual(records.filter(r => r.geometry).map(r => r.name))
    expect(reading.records[0]?.attributes.notes).toBe('Line one\nline two, with a comma')
  })
})

describe('CSV export', () => {
  it('has the documented columns, the centroid as latitude/longitude, and defuses formulas', () => {
    const csv = subpopulationsToCsv(records)
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true })
    expect(parsed.meta.fields).toEqual([...CSV_EXPORT_COLUMNS])
    expect(parsed.data).toHaveLength(25)
    expect(parsed.data[0]?.name).toBe('\'=HYPERLINK("x")')
    expect(Number(parsed.data[2]?.latitude)).toBe(records[2]!.centroid!.lat)
    expect(Number(parsed.data[2]?.longitude)).toBe(records[2]!.centroid!.lon)
    expect(parsed.data[1]?.latitude).toBe('')
    expect(csv.split('\r\n')[0]).toBe(CSV_EXPORT_COLUMNS.join(','))
  })

  it('imports again as points (rows without a location are reported by row number)', () => {
    const reading = readCsvImport(subpopulationsToCsv(records))
    expect(reading.issues.map(i => i.row)).toEqual([3])
    expect(reading.issues[0]?.message).toMatch(/^Row 3 \(".*"\): has no location: latitude and longitude are empty\.$/)
    const placed = readCsvImport(subpopulationsToCsv(records.filter(r => r.centroid)))
    expect(placed.issues).toEqual([])
    expect(placed.records).toHaveLength(24)
    expect(placed.records[1]?.geometry).toEqual({ type: 'Point', coordinates: [records[2]!.centroid!.lon, records[2]!.centroid!.lat] })
  })

  it('makes a file name from the species name', () => {
    expect(exportFileName('Mistridge salamander', 'csv')).toBe('mistridge-salamander-subpopulations.csv')
    expect(exportFileName('Écrevisse (invented)', 'geojson')).toBe('ecrevisse-invented-subpopulations.geojson')
    expect(exportFileName('!!!', 'csv')).toBe('species-subpopulations.csv')
  })
})
