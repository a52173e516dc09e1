/**
 * Every number the proposal pages show has its method, assumptions and citation
 * (shared/proposals/explanations.ts): each entry is complete, every `explain` id used in the
 * proposal components and pages exists, every entry is used, and each displayed result
 * (the elements carrying a raw `data-value`) sits with its "how is this computed" popover.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { CAUTIONS } from '#shared/genetics'
import { EXPLANATION_IDS, EXPLANATIONS, isExplanationId } from '#shared/proposals/explanations'

const root = fileURLToPath(new URL('../../..', import.meta.url))

function filesUnder(folder: string, extension: string): string[] {
  const path = join(root, folder)
  return readdirSync(path).flatMap((name) => {
    const full = join(path, name)
    if (statSync(full).isDirectory()) return filesUnder(join(folder, name), extension)
    return name.endsWith(extension) ? [full] : []
  })
}

const sources = [
  ...filesUnder('components/proposal', '.vue'),
  ...filesUnder('components/scenario', '.vue'),
  ...filesUnder('pages/proposals', '.vue'),
  join(root, 'shared/proposals/key-figures.ts'),
].map(file => ({ file, text: readFileSync(file, 'utf8') }))

/** Ids written literally: explain="x", :explain="'x'", explain: 'x', ? 'x' : 'y' in :explain. */
function usedIds(text: string): string[] {
  const ids = new Set<string>()
  for (const match of text.matchAll(/(?<![:\w-])explain="([a-zA-Z.]+)"/g)) ids.add(match[1]!)
  for (const match of text.matchAll(/:explain="([^"]+)"/g)) for (const literal of match[1]!.matchAll(/'([a-zA-Z]+\.[a-zA-Z]+)'/g)) ids.add(literal[1]!)
  for (const match of text.matchAll(/explain: '([a-zA-Z]+\.[a-zA-Z]+)'/g)) ids.add(match[1]!)
  return [...ids]
}

describe('explanations', () => {
  it('every entry has a title, a method, assumptions, citations and known cautions', () => {
    for (const id of EXPLANATION_IDS) {
      const entry = EXPLANATIONS[id]
      expect(entry.id).toBe(id)
      expect(entry.title.length).toBeGreaterThan(3)
      expect(entry.method.length).toBeGreaterThan(40)
      expect(entry.assumptions.length).toBeGreaterThan(0)
      expect(entry.citations.length).toBeGreaterThan(0)
      for (const caution of entry.cautions) expect(CAUTIONS[caution]).toBeDefined()
    }
  })

  it('every explain id used in the proposal pages exists', () => {
    for (const { file, text } of sources) {
      for (const id of usedIds(text)) expect(isExplanationId(id), `${id} in ${file}`).toBe(true)
    }
  })

  it('every explanation is used by some page (none is stale)', () => {
    const used = new Set(sources.flatMap(({ text }) => usedIds(text)))
    for (const id of EXPLANATION_IDS) expect(used.has(id), id).toBe(true)
  })

  it('each displayed result carries its popover in the same component', () => {
    // data-testid of every element that shows a computed number → the explanation beside it.
    const displayed: Record<string, string> = {
      'establishment-figure': 'establishment.headline',
      'diffusion-value': 'establishment.diffusion',
      'exact-value': 'establishment.exact',
      'haldane-value': 'establishment.haldane',
      'f-with': 'projection.inbreeding',
      'f-without': 'projection.inbreeding',
      'w-without': 'projection.fitness',
      'fitness-ratio': 'projection.fitnessRatio',
      'migrants-value': 'migrants.effective',
      'time-to-establishment': 'time.establishment',
    }
    const withValues = sources.flatMap(({ text }) => [...text.matchAll(/data-testid="([a-z-]+)"[^>]*:data-value=/g)].map(match => match[1]!))
    for (const testId of withValues) expect(Object.keys(displayed), `${testId} shows a number: list it here with its explanation`).toContain(testId)
    for (const [testId, id] of Object.entries(displayed)) {
      const owner = sources.find(({ text }) => text.includes(`data-testid="${testId}"`))
      expect(owner, testId).toBeDefined()
      expect(usedIds(owner!.text), `${testId} in ${owner!.file}`).toContain(id)
    }
  })
})
