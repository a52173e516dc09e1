/**
 * server/security/runtime-headers.ts: HSTS only over https, and the CSP img-src source for an
 * external tile server. Expected values: the documented behaviour (no source).
 */
import { describe, expect, it } from 'vitest'
import { HSTS_VALUE, servesHttps, tileImageSource } from '../../../server/security/runtime-headers'

describe('servesHttps', () => {
  it('is true only for https app URLs', () => {
    expect(servesHttps('https://tributary.example')).toBe(true)
    expect(servesHttps(' HTTPS://tributary.example/ ')).toBe(true)
    expect(servesHttps('http://localhost:3000')).toBe(false)
    expect(servesHttps('')).toBe(false)
    expect(HSTS_VALUE).toMatch(/^max-age=31536000/)
  })
})

describe('tileImageSource', () => {
  it('turns a tile template into a CSP source, with placeholders in the host as a wildcard', () => {
    expect(tileImageSource('https://{s}.tiles.example.org/{z}/{x}/{y}.png')).toBe('https://*.tiles.example.org')
    expect(tileImageSource('https://Tiles.Example.org:8443/{z}/{x}/{y}.png?key=abc')).toBe('https://tiles.example.org:8443')
  })

  it('gives nothing for tiles served by the app itself or an unusable template', () => {
    expect(tileImageSource('/tiles/{z}/{x}/{y}.png')).toBeNull()
    expect(tileImageSource('')).toBeNull()
    expect(tileImageSource('https://bad host;script-src *')).toBeNull()
  })
})
