/**
 * POST /api/calc/establishment: the numbers equal the engine's (shared/genetics) for the same
 * inputs, the exact chain runs only where Ne = census ≤ 2000, the migrants form equals the
 * workspace's single-release computation (shared/proposals) and the binomial average computed
 * here term by term, engine RangeErrors answer 422 at the parameter, and bad shapes answer 422
 * by path.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import {
  branchingSurvivalProbability, exactFixationProbabilities, exactFixationProbability, fixationMethodWarnings,
  fixationProbability, haldaneApproximation, log10FixationProbability,
} from '../../shared/genetics'
import { computeExactVector, variantEstablishment } from '../../shared/proposals'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'

const server = useServer()
const url = '/api/calc/establishment'
let viewer: ApiClient

beforeAll(async () => {
  viewer = await server.signIn(demo.viewer)
})

/** |a − b| ≤ tolerance·|b| (relative), for sums computed in a different order. */
function expectRelativelyClose(actual: number, expected: number, tolerance: number, label = ''): void {
  expect(Math.abs(actual - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tolerance * Math.abs(expected))
}

/** Binomial(n, q) probabilities by the product formula (independent of the server's log-space walk). */
function binomialProbabilities(n: number, q: number): number[] {
  const probabilities: number[] = []
  let coefficient = 1
  for (let k = 0; k <= n; k++) {
    probabilities.push(coefficient * q ** k * (1 - q) ** (n - k))
    coefficient = (coefficient * (n - k)) / (k + 1)
  }
  return probabilities
}

/** The engine's RangeError message for these inputs, as the route words it. */
function engineMessage(call: () => unknown): { parameter: string, message: string } {
  try {
    call()
  } catch (error) {
    const match = /^[A-Za-z]+: ([A-Za-z]+) must be (.*)$/.exec((error as Error).message)
    if (match) return { parameter: match[1]!, message: `${match[1]} must be ${match[2]}.` } // both groups always match
  }
  throw new Error('the engine did not refuse these inputs')
}

describe('who may call it', () => {
  it('401 anonymous; any signed-in role of any agency gets 200 (no record is read)', async () => {
    const body = { census: 50, effectiveSize: 50, s: 0.05, h: 0.5, copies: 1 }
    expectErrorAnswer(await server.anonymous().post(url, body), 401)
    for (const email of Object.values(demo)) expect((await (await server.signIn(email)).post(url, body)).status, email).toBe(200)
    const other = await createOtherAgency(server)
    expect((await (await server.signIn(other.biologistEmail, otherAgencyPassword)).post(url, body)).status).toBe(200)
  })
})

describe('copies introduced at once', () => {
  it('equals the engine: diffusion, exact chain (Ne = census ≤ 2000), 2hs, branching and warnings', async () => {
    const inputs = { census: 100, effectiveSize: 100, s: 0.05, h: 0.5, copies: 2 }
    const response = await viewer.post(url, inputs)
    expect(response.status).toBe(200)
    const body = response.body
    const diffusion = fixationProbability(inputs)
    expect(body.diffusion.probability).toBe(diffusion)
    expect(body.diffusion.log10Probability).toBe(log10FixationProbability(inputs))
    expect(body.exact.probability).toBe(exactFixationProbability({ census: 100, s: 0.05, h: 0.5, copies: 2 }))
    const haldane = haldaneApproximation(inputs)
    expect(body.haldane).toEqual({
      linear: haldane.linear, saturating: haldane.saturating, withinValidity: haldane.withinValidity,
      relativeErrorVsDiffusion: (haldane.saturating - diffusion) / diffusion,
    })
    const pi = branchingSurvivalProbability({ s: 0.05, h: 0.5 })
    expectRelativelyClose(body.branching.probability, 1 - (1 - pi) ** 2, 1e-14, 'branching')
    const expectedWarnings = [...fixationMethodWarnings(inputs), ...(haldane.withinValidity ? [] : ['rule-of-thumb-only'])]
    expect(body.warnings.map((w: { id: string }) => w.id)).toEqual(expectedWarnings)
    expect(body.cautions.map((c: { id: string }) => c.id)).toEqual(['constant-selection', 'effective-size-sets-drift', 'diffusion-assumptions', 'probability-display'])
    expect(body.copies).toEqual({ mode: 'fixed', copies: 2 })
  })

  it('names the strong-selection and small-Ne warnings the engine gives', async () => {
    const inputs = { census: 5, effectiveSize: 5, s: 0.5, h: 1, copies: 1 }
    const body = (await viewer.post(url, inputs)).body
    expect(body.warnings.map((w: { id: string }) => w.id)).toEqual(['very-small-effective-size', 'strong-selection', 'exact-chain-preferred', 'rule-of-thumb-only'])
    expect(body.exact.probability).toBe(exactFixationProbability({ census: 5, s: 0.5, h: 1, copies: 1 }))
    expect(body.warnings[0].title.length).toBeGreaterThan(3)
  })

  it('runs no exact chain when Ne differs from the census or the census is above 2000', async () => {
    const smallNe = (await viewer.post(url, { census: 500, effectiveSize: 50, s: 0.02, h: 0.5, copies: 1 })).body
    expect(smallNe.exact).toBeNull()
    expect(smallNe.exactNote).toMatch(/needs Ne = census/)
    expect(smallNe.diffusion.probability).toBe(fixationProbability({ census: 500, effectiveSize: 50, s: 0.02, h: 0.5, copies: 1 }))
    const large = (await viewer.post(url, { census: 2001, effectiveSize: 2001, s: 0.02, h: 0.5, copies: 1 })).body
    expect(large.exact).toBeNull()
    expect(large.exactNote).toMatch(/census ≤ 2000/)
    const edge = (await viewer.post(url, { census: 2000, effectiveSize: 2000, s: 0.02, h: 0.5, copies: 1 })).body
    expect(edge.exact.probability).toBe(exactFixationProbability({ census: 2000, s: 0.02, h: 0.5, copies: 1 }))
  })

  it('no copies: probability 0, no 2hs figure, log10 null', async () => {
    const body = (await viewer.post(url, { census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 0 })).body
    expect(body.diffusion).toEqual({ probability: 0, log10Probability: null })
    expect(body.haldane).toBeNull()
    expect(body.branching.probability).toBe(0)
  })
})

describe('migrants per event with a source frequency', () => {
  /** The workspace's figures for one release of `migrants` animals (shared/proposals). */
  function workspace(census: number, effectiveSize: number, s: number, h: number, migrants: number, q: number) {
    return variantEstablishment({
      recipient: { census, effectiveSize, generationTimeYears: 1, initialInbreeding: 0 },
      schedule: { animalsPerEvent: migrants, females: migrants, males: 0, intervalYears: 1, events: 1, firstEventYear: 0 },
      variant: { name: 'v', sourceFrequency: q, s, sRange: [s, s], h, hRange: [h, h] },
      index: 0, releaseYears: [0], horizonYears: 1, exactVector: computeExactVector,
    })
  }

  it('equals the workspace\'s single release, and the term-by-term binomial average of the engine', async () => {
    // 196 residents + 4 migrants = 200 = Ne: the exact chain then starts exactly at j copies.
    const [census, effectiveSize, s, h, migrants, q] = [196, 200, 0.1, 0.5, 4, 0.25]
    const response = await viewer.post(url, { census, effectiveSize, s, h, migrantsPerEvent: migrants, sourceFrequency: q })
    expect(response.status).toBe(200)
    const body = response.body
    const expected = workspace(census, effectiveSize, s, h, migrants, q)
    expect(body.diffusion.probability).toBe(expected.diffusion.probability)
    expect(body.exact.probability).toBe(expected.exact.status === 'computed' ? expected.exact.probability : Number.NaN)
    expect(body.haldane.saturating).toBe(expected.haldane.probability)
    expect(body.haldane.linear).toBe(expected.haldane.linear)
    expect(body.branching.probability).toBe(expected.branching.probability)
    expect(body.warnings.map((w: { id: string }) => w.id)).toEqual(expected.warnings)

    const weights = binomialProbabilities(2 * migrants, q)
    const exactVector = exactFixationProbabilities({ census: effectiveSize, s, h })
    const pi = branchingSurvivalProbability({ s, h })
    let diffusion = 0
    let exact = 0
    let branching = 0
    weights.forEach((weight, copies) => {
      diffusion += weight * fixationProbability({ census: census + migrants, effectiveSize, s, h, copies })
      exact += weight * (exactVector[copies] ?? Number.NaN)
      branching += weight * (1 - (1 - pi) ** copies)
    })
    expectRelativelyClose(body.diffusion.probability, diffusion, 1e-12, 'diffusion')
    expectRelativelyClose(body.exact.probability, exact, 1e-9, 'exact')
    expectRelativelyClose(body.branching.probability, branching, 1e-12, 'branching')
    expect(body.copies.mode).toBe('binomial')
    expect(body.copies.distribution).toMatchObject({ geneCopies: 8, sourceFrequency: q, mean: 2 })
    expectRelativelyClose(body.copies.distribution.probabilityNone, 0.75 ** 8, 1e-14, 'P(none)')
    expect(body.inputs).toEqual({ census, effectiveSize, s, h, copies: null, migrantsPerEvent: migrants, sourceFrequency: q })
  })

  it('with frequency 1 it equals the fixed-copies answer for 2·migrants copies in census + migrants', async () => {
    const base = { effectiveSize: 60, s: 0.03, h: 0.3 }
    const mixed = (await viewer.post(url, { ...base, census: 297, migrantsPerEvent: 3, sourceFrequency: 1 })).body
    expectRelativelyClose(mixed.diffusion.probability, fixationProbability({ ...base, census: 300, copies: 6 }), 1e-12, 'q = 1')
  })

  it('no exact chain above round(Ne) = 2000', async () => {
    const body = (await viewer.post(url, { census: 5000, effectiveSize: 2500, s: 0.01, h: 0.5, migrantsPerEvent: 2, sourceFrequency: 0.5 })).body
    expect(body.exact).toBeNull()
    expect(body.exactNote).toMatch(/above 2000/)
  })
})

describe('engine domain errors answer 422 at the parameter', () => {
  const cases: { name: string, body: Record<string, number>, engine: () => unknown }[] = [
    { name: 's ≤ −1', body: { census: 100, effectiveSize: 100, s: -2, h: 0.5, copies: 1 }, engine: () => fixationMethodWarnings({ census: 100, effectiveSize: 100, s: -2, h: 0.5 }) },
    { name: '1 + h·s ≤ 0', body: { census: 100, effectiveSize: 100, s: 0.5, h: -3, copies: 1 }, engine: () => fixationMethodWarnings({ census: 100, effectiveSize: 100, s: 0.5, h: -3 }) },
    { name: 'census not whole', body: { census: 2.5, effectiveSize: 2, s: 0.1, h: 0.5, copies: 1 }, engine: () => fixationMethodWarnings({ census: 2.5, effectiveSize: 2, s: 0.1, h: 0.5 }) },
    { name: 'Ne = 0', body: { census: 10, effectiveSize: 0, s: 0.1, h: 0.5, copies: 1 }, engine: () => fixationMethodWarnings({ census: 10, effectiveSize: 0, s: 0.1, h: 0.5 }) },
    { name: 'copies > 2N', body: { census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 25 }, engine: () => fixationProbability({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 25 }) },
    { name: 'copies not whole', body: { census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 1.5 }, engine: () => fixationProbability({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 1.5 }) },
  ]
  for (const testCase of cases) {
    it(testCase.name, async () => {
      const expected = engineMessage(testCase.engine)
      const response = await viewer.post(url, testCase.body)
      expectErrorAnswer(response, 422)
      expect(response.body.issues).toEqual([{ path: expected.parameter, message: expected.message }])
      expect(response.body.message).toBe(`${expected.parameter}: ${expected.message}`)
    })
  }

  it('migrants mode: a census that is not a whole number', async () => {
    const expected = engineMessage(() => fixationMethodWarnings({ census: 3.5, effectiveSize: 3, s: 0.1, h: 0.5 }))
    const response = await viewer.post(url, { census: 3.5, effectiveSize: 3, s: 0.1, h: 0.5, migrantsPerEvent: 4, sourceFrequency: 0.5 })
    expectErrorAnswer(response, 422)
    expect(response.body.issues).toEqual([{ path: 'census', message: expected.message }])
  })
})

describe('bad input', () => {
  it('400 for malformed JSON; 422 naming each missing field', async () => {
    expectErrorAnswer(await viewer.request('POST', url, '{"census": 1,', { 'content-type': 'application/json' }), 400, /not valid JSON/)
    const empty = await viewer.post(url, {})
    expectErrorAnswer(empty, 422)
    expect(empty.body.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['census', 'effectiveSize', 's', 'h']))
  })

  it('422 for wrong types, unknown fields and both or neither of copies / migrants', async () => {
    const wrong = await viewer.post(url, { census: '100', effectiveSize: null, s: [], h: {}, copies: 'one' })
    expectErrorAnswer(wrong, 422)
    expect(wrong.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['census', 'copies', 'effectiveSize', 'h', 's'])
    const base = { census: 10, effectiveSize: 10, s: 0.1, h: 0.5 }
    expectErrorAnswer(await viewer.post(url, { ...base, copies: 1, extra: true }), 422, /Unknown field: extra/)
    const both = await viewer.post(url, { ...base, copies: 1, migrantsPerEvent: 2, sourceFrequency: 0.5 })
    expectErrorAnswer(both, 422, /not both/)
    const neither = await viewer.post(url, base)
    expectErrorAnswer(neither, 422)
    expect(neither.body.issues[0].path).toBe('copies')
    const half = await viewer.post(url, { ...base, migrantsPerEvent: 2 })
    expectErrorAnswer(half, 422)
    expect(half.body.issues).toEqual([{ path: 'sourceFrequency', message: 'Send sourceFrequency with migrantsPerEvent.' }])
    for (const sourceFrequency of [0, 1.5, -0.1]) {
      const response = await viewer.post(url, { ...base, migrantsPerEvent: 2, sourceFrequency })
      expectErrorAnswer(response, 422)
      expect(response.body.issues[0].path).toBe('sourceFrequency')
    }
    for (const migrantsPerEvent of [0, 2.5, 501]) {
      const response = await viewer.post(url, { ...base, migrantsPerEvent, sourceFrequency: 0.5 })
      expectErrorAnswer(response, 422)
      expect(response.body.issues[0].path).toBe('migrantsPerEvent')
    }
  })

  it('413 for a body over 16 KB', async () => {
    expectErrorAnswer(await viewer.post(url, { census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 1, padding: 'x'.repeat(20_000) }), 413)
  })
})
