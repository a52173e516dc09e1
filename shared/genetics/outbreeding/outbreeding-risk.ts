import { domainError } from '../validate'

/** An answer to one screening question: yes, no, or not known. */
export type ScreenAnswer = boolean | 'unknown'

/** The four questions of the screen, by input name. */
export type OutbreedingQuestion = 'sameSpecies' | 'fixedChromosomalDifferences' | 'geneFlowWithin500Years' | 'similarEnvironments'

export interface OutbreedingRiskResult {
  /** 'low' only when every answer is the low-risk one; otherwise 'elevated'. */
  readonly level: 'low' | 'elevated'
  /** Plain-words reasons: every criterion that raised the risk, or why the risk is low. */
  readonly reasons: string[]
  /** Questions whose answer raised the risk (including 'unknown' answers), in screen order. */
  readonly raisedBy: OutbreedingQuestion[]
  /** Questions answered 'unknown' (a subset of `raisedBy`). */
  readonly unanswered: OutbreedingQuestion[]
}

interface Criterion {
  readonly question: OutbreedingQuestion
  /** The answer that keeps the risk low. */
  readonly lowRiskAnswer: boolean
  readonly riskReason: string
  readonly unknownReason: string
}

// Order as in the published figure (as recalled, SCIENCE.md §7); the outcome
// does not depend on it because any one risky answer elevates the risk.
const CRITERIA: readonly Criterion[] = [
  {
    question: 'sameSpecies',
    lowRiskAnswer: true,
    riskReason: 'The two populations belong to different species.',
    unknownReason: 'It is not known whether the two populations are the same species; this is counted as a risk until it is settled.',
  },
  {
    question: 'fixedChromosomalDifferences',
    lowRiskAnswer: false,
    riskReason: 'The populations carry fixed chromosomal differences (karyotype or ploidy), which can leave hybrids with reduced fertility.',
    unknownReason: 'It is not known whether the populations differ in their chromosomes; this is counted as a risk until karyotypes are checked.',
  },
  {
    question: 'geneFlowWithin500Years',
    lowRiskAnswer: true,
    riskReason: 'The populations have not exchanged genes within the last 500 years, which leaves time for local adaptation or genetic incompatibilities to build up.',
    unknownReason: 'It is not known whether the populations exchanged genes within the last 500 years; this is counted as a risk until the isolation history is known.',
  },
  {
    question: 'similarEnvironments',
    lowRiskAnswer: true,
    riskReason: 'The populations live in different environments, so each may be adapted to conditions the other lacks.',
    unknownReason: 'It is not known whether the two environments are similar; this is counted as a risk until they are compared.',
  },
]

const LOW_RISK_REASON = 'Same species, no fixed chromosomal differences, gene exchange within the last 500 years and similar environments: the screen predicts a low probability of outbreeding depression.'

/**
 * Screen for the risk of outbreeding depression when crossing two
 * populations, following the decision tree of Frankham et al. (2011).
 *
 * Why: rapid outbreeding depression comes mainly from adaptive
 * differentiation or fixed chromosomal differences; the screen flags source
 * populations for which crossing should be avoided or tried only on a
 * limited, experimental basis (test crosses followed into at least the F2).
 * The product shows this next to the (usually larger) cost of continued
 * inbreeding rather than as a verdict (SCIENCE.md §7).
 *
 * Rule: the risk is 'low' only if the populations are the same species,
 * have no fixed chromosomal differences, have exchanged genes within the last
 * 500 years and live in similar environments; any other answer — including
 * 'unknown', which is treated as the risky answer and reported as such —
 * makes it 'elevated'. Every criterion that raised the risk is listed.
 * Reasons are our own wording.
 * Reference: Frankham, R., Ballou, J. D., Eldridge, M. D. B., Lacy, R. C.,
 *   Ralls, K., Dudash, M. R., Fenster, C. B. (2011). Predicting the
 *   probability of outbreeding depression. Conservation Biology 25: 465–475.
 *
 * @param sameSpecies - are the two populations the same species? true / false / 'unknown'
 * @param fixedChromosomalDifferences - do they differ by fixed chromosomal
 *   differences (karyotype, ploidy)? true / false / 'unknown'
 * @param geneFlowWithin500Years - have they exchanged genes within the last
 *   500 years? true / false / 'unknown'
 * @param similarEnvironments - do they occupy similar environments? true / false / 'unknown'
 * @returns `{ level, reasons, raisedBy, unanswered }` (new arrays)
 * @throws RangeError if an answer is not true, false or 'unknown'
 * @example outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: false, geneFlowWithin500Years: true, similarEnvironments: true }).level   // 'low'
 * @example outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: false, geneFlowWithin500Years: true, similarEnvironments: false }).level  // 'elevated'
 * @example outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: 'unknown', geneFlowWithin500Years: true, similarEnvironments: true }).unanswered  // ['fixedChromosomalDifferences']
 */
export function outbreedingRisk(answers: {
  sameSpecies: ScreenAnswer
  fixedChromosomalDifferences: ScreenAnswer
  geneFlowWithin500Years: ScreenAnswer
  similarEnvironments: ScreenAnswer
}): OutbreedingRiskResult {
  const reasons: string[] = []
  const raisedBy: OutbreedingQuestion[] = []
  const unanswered: OutbreedingQuestion[] = []
  for (const criterion of CRITERIA) {
    const answer: unknown = answers[criterion.question]
    if (answer !== true && answer !== false && answer !== 'unknown') {
      domainError('outbreedingRisk', criterion.question, 'true, false or \'unknown\'', answer)
    }
    if (answer === criterion.lowRiskAnswer) continue
    raisedBy.push(criterion.question)
    if (answer === 'unknown') {
      unanswered.push(criterion.question)
      reasons.push(criterion.unknownReason)
    } else {
      reasons.push(criterion.riskReason)
    }
  }
  if (raisedBy.length === 0) return { level: 'low', reasons: [LOW_RISK_REASON], raisedBy, unanswered }
  return { level: 'elevated', reasons, raisedBy, unanswered }
}
