/**
 * Records → BriefData: the figures are the engine's (computeScenarioResults for the same
 * inputs), the recommendation says what the recommended scenario does, the screen follows
 * Frankham et al. (2011), and workspace wording is made fit for paper.
 */
import { describe, expect, it } from 'vitest'
import { assembleBriefData, printable, publicSource, scheduleText } from '../../../server/brief/assemble'
import { computeScenarioResults } from '../../../shared/proposals/results'
import { demoBriefRecords } from './demo-records'

describe('assembleBriefData', () => {
  const records = demoBriefRecords()
  const data = assembleBriefData(records)

  it('keeps the baseline first and marks the recommended scenario', () => {
    expect(data.scenarios.map(scenario => scenario.name)).toEqual(['No action', 'Scenario A', 'Scenario B'])
    expect(data.scenarios.filter(scenario => scenario.recommended).map(scenario => scenario.id)).toEqual([3])
  })

  it('prints the engine\'s figures for the same inputs', () => {
    const recipient = { census: 12, effectiveSize: 3, generationTimeYears: 3.8, initialInbreeding: 0 }
    for (const record of records.scenarios) {
      const expected = computeScenarioResults({ recipient, inputs: record.inputs })
      const printed = data.scenarios.find(scenario => scenario.id === record.id)
      const series = expected.hasRelease ? expected.projection.withAction : expected.projection.withoutAction
      expect(printed?.atHorizon.inbreeding).toBe(series.inbreeding[series.inbreeding.length - 1])
      expect(printed?.atHorizon.fitness).toBe(series.fitness[series.fitness.length - 1])
      expect(printed?.migrantsPerGeneration).toBe(expected.hasRelease ? expected.migrantsPerGeneration.effectiveMigrants : 0)
      expect(printed?.establishment.map(item => item.overSchedule)).toEqual(expected.establishment.map(item => item.headline.probability))
      expect(printed?.projection).toHaveLength(expected.projection.years.length)
    }
  })

  it('writes the recommendation from the recommended scenario and the baseline', () => {
    const [first, second] = data.recommendation
    expect(first).toBe('Move 6 animals (3 females, 3 males) from Lanternmoss Gap into Fernwhistle Creek every 4 years, 5 releases starting now (scenario "Scenario B").')
    const chosen = data.scenarios[2]
    const baseline = data.scenarios[0]
    expect(second).toContain(chosen?.atHorizon.inbreeding.toFixed(3))
    expect(second).toContain(baseline?.atHorizon.inbreeding.toFixed(3))
    expect(data.recommendation.at(-1)).toBe('Why this scenario: Scenario B restores the most gene flow for the fewest animals.')
  })

  it('says so when no scenario moves animals', () => {
    const only = assembleBriefData(demoBriefRecords({ scenarios: records.scenarios.slice(0, 1) }))
    expect(only.recommendation[0]).toMatch(/^No scenario in this proposal moves animals into Fernwhistle Creek/)
  })

  it('treats an unknown screen answer as elevated risk and lists the reason', () => {
    expect(data.outbreeding?.level).toBe('elevated')
    expect(data.outbreeding?.answers.map(answer => answer.answer)).toEqual(['yes', 'no', 'yes', 'unknown'])
    expect(data.outbreeding?.reasons.join(' ')).toMatch(/not known whether the two environments are similar/)
    const none = assembleBriefData(demoBriefRecords({ proposal: { ...records.proposal, outbreedingAnswers: {} } }))
    expect(none.outbreeding).toBeNull()
  })

  it('measures distances to the recipient along the great circle', () => {
    expect(data.recipient.distanceToRecipientKm).toBeNull()
    expect(data.sources[0]?.distanceToRecipientKm).toBeGreaterThan(100)
  })

  it('reports instead of failing when the recipient has no figures', () => {
    const bare = assembleBriefData(demoBriefRecords({ recipient: { ...records.recipient, latestCensus: null, workingNe: null } }))
    expect(bare.scenarios.every(scenario => scenario.notes.some(note => /no census count or effective size/.test(note)))).toBe(true)
  })

  it('prints methods and cautions without internal references or screen-only words', () => {
    const all = JSON.stringify([data.methods, data.cautions])
    expect(all).not.toMatch(/SCIENCE\.md|chip under the figure|popover/)
    expect(data.methods.length).toBeGreaterThanOrEqual(8)
    expect(data.methods.every(method => method.sources.length > 0)).toBe(true)
  })
})

describe('wording helpers', () => {
  it('scheduleText', () => {
    expect(scheduleText({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 })).toBe('4 animals (2 females, 2 males) every 5 years, 3 releases starting now')
    expect(scheduleText({ animalsPerEvent: 1, females: 1, males: 0, intervalYears: 5, events: 1, firstEventYear: 2 })).toBe('1 animal (1 female, 0 males) once, in year 2')
    expect(scheduleText(null)).toBe('No animals moved')
  })

  it('printable drops sentences about interface elements and cross-references', () => {
    expect(printable('Shown from the exact chain. The chip under the figure says which.')).toBe('Shown from the exact chain.')
    expect(printable('Releases count as independent chances (see "Several releases").')).toBe('Releases count as independent chances.')
  })

  it('publicSource removes internal references and drops entries that were only that', () => {
    expect(publicSource('Kimura (1962), Genetics 47: 713–719 [SCIENCE.md §1.1]')).toBe('Kimura (1962), Genetics 47: 713–719')
    expect(publicSource('[SCIENCE.md §3.3]')).toBe('')
    expect(publicSource('SCIENCE.md §2.2 (chain of size round(Ne) as a labelled approximation when Ne < N).')).toBe('')
    expect(publicSource('Exact chain, solved by state reduction (SCIENCE.md §2; checked against a computation).')).toBe('Exact chain, solved by state reduction.')
  })
})
