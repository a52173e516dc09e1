/**
 * Reading GeoJSON and CSV imports (shared/atlas/import-*.ts): every problem names its feature
 * (1-based) or spreadsheet row (header = row 1) and the reason. Only records that pass every
 * check are returned; the server stores nothing unless there are no issues at all
 * (tests/api/atlas.test.ts checks that in the database).
 */
import { describe, expect, it } from 'vitest'
import { readCsvImport } from '../../../shared/atlas/import-csv'
import { readGeoJsonImport } from '../../../shared/atlas/import-geojson'
import { fieldFor, numberFrom } from '../../../shared/atlas/import-record'

const polygon = (lon: number, lat: number) => ({ type: 'Polygon', coordinates: [[[lon, lat], [lon + 0.05, lat], [lon + 0.05, lat + 0.05], [lon, lat + 0.05], [lon, lat]]] })
const feature = (properties: Record<string, unknown>, geometry: unknown) => ({ type: 'Feature', properties, geometry })
const collection = (...features: unknown[]) => JSON.stringify({ type: 'FeatureCollection', features })

describe('GeoJSON import', () => {
  it('reads names and attributes (any spelling of the property names)', () => {
    const text = collection(
      feature({ 'name': 'Upper Fold', 'environment_class': 'cove forest', 'Generation time': 2.5, 'yearsIsolated': '40', 'notes': 'n' }, polygon(-83.5, 35.5)),
      feature({ Name: 'Lower Fold', generationTimeYears: 3 }, { type: 'Point', coordinates: [-83.4, 35.4] }),
    )
    const { records, issues } = readGeoJsonImport(text)
    expect(issues).toEqual([])
    expect(records.map(r => [r.name, r.attributes.environmentClass, r.attributes.generationTimeYears, r.attributes.yearsIsolated])).toEqual([
      ['Upper Fold', 'cove forest', 2.5, 40],
      ['Lower Fold', null, 3, null],
    ])
    expect(records[0]?.given.sort()).toEqual(['environmentClass', 'generationTimeYears', 'notes', 'yearsIsolated'])
    expect(records[1]?.given).toEqual(['generationTimeYears'])
  })

  it('uses the default generation time for features without one', () => {
    const { records } = readGeoJsonImport(collection(feature({ name: 'A' }, polygon(-83, 35))), { defaultGenerationTimeYears: 4 })
    expect(records[0]?.attributes.generationTimeYears).toBe(4)
    expect(records[0]?.given).toEqual([])
  })

  it('names each bad feature and the reason (and keeps only the valid ones as records)', () => {
    const text = collection(
      feature({ name: 'Good', generationTimeYears: 3 }, polygon(-83.5, 35.5)),
      feature({ name: 'Crossed', generationTimeYears: 3 }, { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] }),
      feature({ generationTimeYears: 3 }, polygon(-83.2, 35.2)),
      feature({ name: 'Good', generationTimeYears: 'three' }, polygon(-83.1, 35.1)),
      feature({ name: 'Line', generationTimeYears: 3 }, { type: 'LineString', coordinates: [[0, 0], [1, 1]] }),
      feature({ name: 'Nothing', generationTimeYears: 3 }, null),
      { type: 'Point', coordinates: [0, 0] },
    )
    const { records, issues } = readGeoJsonImport(text)
    expect(records.map(record => record.origin)).toEqual([{ kind: 'feature', number: 1 }])
    expect(issues.map(issue => issue.message)).toEqual([
      'Feature 2 ("Crossed"): The boundary crosses itself near 35.0500° N, 82.9500° W. Redraw it so its edges do not cross.',
      'Feature 3: Enter a name.',
      'Feature 4 ("Good"): generationTimeYears must be a number (years), got "three".',
      'Feature 5 ("Line"): A boundary must be a Polygon, MultiPolygon or Point, not a LineString.',
      'Feature 6 ("Nothing"): has no geometry; each feature needs a Polygon, MultiPolygon or Point.',
      'Feature 7: is not a GeoJSON Feature (it needs "type": "Feature", a geometry and properties).',
    ])
    expect(issues.map(issue => issue.feature)).toEqual([2, 3, 4, 5, 6, 7])
    expect(issues[0]?.path).toBe('features.1.geometry')
  })

  it('reports a name used twice in the file on the later feature', () => {
    const { issues } = readGeoJsonImport(collection(
      feature({ name: 'Twin', generationTimeYears: 3 }, polygon(-83.5, 35.5)),
      feature({ name: 'twin', generationTimeYears: 3 }, polygon(-83.2, 35.5)),
    ))
    expect(issues).toEqual([{ path: 'features.1.name', feature: 2, message: 'Feature 2 ("twin"): the name is already used by feature 1 of this file.' }])
  })

  it('explains whole-file problems: not JSON (with line and column), not a collection, empty', () => {
    expect(readGeoJsonImport('{"type": "FeatureCollection",\n "features": [}').issues[0]?.message).toMatch(/^The file is not valid JSON: .*\(2:\d+\)/)
    expect(readGeoJsonImport('{"type":"Polygon","coordinates":[]}').issues[0]?.message).toBe('The file must be a GeoJSON FeatureCollection (or one Feature); it is a Polygon.')
    expect(readGeoJsonImport('[]').issues[0]?.message).toMatch(/it is something else/)
    expect(readGeoJsonImport(collection()).issues[0]?.message).toBe('The file has no features to import.')
    expect(readGeoJsonImport(JSON.stringify(feature({ name: 'Solo', generationTimeYears: 2 }, polygon(0, 0)))).records).toHaveLength(1)
  })
})

describe('CSV import', () => {
  it('reads points from name, latitude, longitude and optional attributes', () => {
    const csv = '\uFEFFName,Lat,Lon,Environment class,generation_time_years,years_isolated\r\nHigh Seep,35.61,-83.45,seep,3,12\r\n"Low, Wet",35.2,-83.05,,2.5,\r\n\r\n'
    const { records, issues } = readCsvImport(csv)
    expect(issues).toEqual([])
    expect(records.map(r => ({ name: r.name, geometry: r.geometry, origin: r.origin, env: r.attributes.environmentClass }))).toEqual([
      { name: 'High Seep', geometry: { type: 'Point', coordinates: [-83.45, 35.61] }, origin: { kind: 'row', number: 2 }, env: 'seep' },
      { name: 'Low, Wet', geometry: { type: 'Point', coordinates: [-83.05, 35.2] }, origin: { kind: 'row', number: 3 }, env: null },
    ])
  })

  it('names the spreadsheet row of each problem (header = row 1; blank rows still count)', () => {
    const csv = [
      'name,latitude,longitude,generation_time_years',
      'Fine,35.5,-83.5,3',
      '',
      'Too far north,95,-83,3',
      'Off the map,35.4,-200,3',
      'No time,35.5,-83.1,',
      ',35.5,-83.2,3',
      'Words,thirty-five,-83,3',
      'Fine,35.6,-83.6,3',
      'Extra,35.6,-83.6,3,surprise',
    ].join('\n')
    const { records, issues } = readCsvImport(csv)
    expect(records.map(record => record.origin.number)).toEqual([2])
    expect(issues.map(issue => issue.message)).toEqual([
      'Row 4 ("Too far north"): latitude must be between -90 and 90 degrees, got 95.',
      'Row 5 ("Off the map"): longitude must be between -180 and 180 degrees, got -200.',
      'Row 6 ("No time"): generation_time_years is missing; give it in the file or set a default generation time for the import.',
      'Row 7: Enter a name.',
      'Row 8 ("Words"): latitude must be a number of decimal degrees, got "thirty-five".',
      'Row 9 ("Fine"): the name is already used by row 2 of this file.',
      'Row 10 ("Extra"): has 5 values but the header has 4 columns (a comma inside a value needs quotes).',
    ])
    expect(issues.map(issue => issue.row)).toEqual([4, 5, 6, 7, 8, 9, 10])
    expect(issues[0]?.path).toBe('rows.4.latitude')
  })

  it('asks for the required columns by name', () => {
    expect(readCsvImport('site,lat\nA,35').issues[0]?.message).toBe('The CSV needs the columns name, latitude and longitude in its first row; missing: name, longitude (the first row has: site, lat).')
    expect(readCsvImport('name,latitude,longitude\n').issues[0]?.message).toBe('The CSV has a header but no rows to import.')
  })
})

describe('field names and numbers', () => {
  it('maps spellings to our fields', () => {
    expect(fieldFor('Environment class')).toBe('environmentClass')
    expect(fieldFor('generation_time_years')).toBe('generationTimeYears')
    expect(fieldFor('LNG')).toBe('longitude')
    expect(fieldFor('colour')).toBeUndefined()
  })

  it('reads numbers strictly: no thousands separators, commas or units', () => {
    expect(numberFrom(' 3.5 ')).toBe(3.5)
    expect(numberFrom('-83')).toBe(-83)
    expect(numberFrom('1e3')).toBe(1000)
    expect(numberFrom('')).toBeNull()
    expect(numberFrom(null)).toBeNull()
    for (const junk of ['3,5', '3 yrs', '1,000', 'NaN', 'Infinity', '0x10']) expect(numberFrom(junk)).toBeNaN()
  })
})
