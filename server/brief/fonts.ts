/**
 * The fonts of the PDF brief: full Inter TTFs (SIL Open Font License, server/assets/fonts/OFL.txt)
 * so Greek letters, subscripts and symbols (Ne, F_ST, Δ, ≈, Hₜ) print.
 *
 * pdfmake needs absolute paths to real files: SVG text (charts, map) is drawn through pdfkit,
 * which opens fonts by path, and font Buffers crash there. The built server has no source tree,
 * so the TTFs ship as Nitro server assets (server/assets/fonts → `assets:server`) and are written
 * once per process to a private temporary directory; scripts and tests read them from the source
 * tree instead. Either way `ensureBriefFonts` returns the directory and the pdfmake font table.
 */
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/** The font files, by pdfmake family and style. */
export const BRIEF_FONT_FILES = {
  Inter: {
    normal: 'Inter-Regular.ttf',
    bold: 'Inter-Bold.ttf',
    italics: 'Inter-Italic.ttf',
    bolditalics: 'Inter-BoldItalic.ttf',
  },
  InterSemiBold: {
    normal: 'Inter-SemiBold.ttf',
    bold: 'Inter-Bold.ttf',
    italics: 'Inter-Italic.ttf',
    bolditalics: 'Inter-BoldItalic.ttf',
  },
} as const

export type BriefFontTable = Record<keyof typeof BRIEF_FONT_FILES, { normal: string, bold: string, italics: string, bolditalics: string }>

/** Reads one font file by name (e.g. 'Inter-Regular.ttf'). */
export type FontReader = (fileName: string) => Promise<Buffer | Uint8Array>

let prepared: Promise<{ directory: string, fonts: BriefFontTable }> | undefined

function uniqueFileNames(): string[] {
  return [...new Set(Object.values(BRIEF_FONT_FILES).flatMap(styles => Object.values(styles)))]
}

/**
 * Writes the font files to a temporary directory once per process.
 *
 * @param read - where the bytes come from (server assets in Nitro, the source tree elsewhere)
 * @returns the directory and the pdfmake font table with absolute paths
 */
export function ensureBriefFonts(read: FontReader): Promise<{ directory: string, fonts: BriefFontTable }> {
  prepared ??= (async () => {
    const directory = mkdtempSync(join(tmpdir(), 'tributary-fonts-'))
    for (const name of uniqueFileNames()) {
      const bytes = await read(name)
      if (!bytes || bytes.length < 1000) throw new Error(`Font ${name} is missing from the server assets.`)
      writeFileSync(join(directory, name), bytes)
    }
    const fonts = Object.fromEntries(Object.entries(BRIEF_FONT_FILES).map(([family, styles]) => [
      family,
      Object.fromEntries(Object.entries(styles).map(([style, file]) => [style, join(directory, file)])),
    ])) as BriefFontTable
    return { directory, fonts }
  })().catch((error: unknown) => {
    prepared = undefined
    throw error
  })
  return prepared
}
