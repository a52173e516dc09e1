/**
 * Method, assumptions and citation of every number the proposal workspace, the compare page
 * and the brief show — as data, one entry per displayed number.
 *
 * Single source of truth for that wording. Read by components/proposal/ProposalExplain.vue
 * (the "how is this computed?" popover), the compare page and the PDF brief. Every `explain`
 * id used in components/proposal/**, components/scenario/** and pages/proposals/** must be a
 * key here (tests/unit/proposals/explanations.test.ts checks the files). Adding an id needs an
 * entry (the Record type enforces it). Wording is ours; formulas keep their published names.
 * Cautions are referred to by their ids in shared/genetics/cautions.ts.
 */
import type { CautionId } from '../genetics'
import { EXACT_CHAIN_LIMIT } from './exact-start'

/** Every number that has an explanation. */
export type ExplanationId
  = | 'establishment.headline'
    | 'establishment.diffusion'
    | 'establishment.exact'
    | 'establishment.range'
    | 'establishment.haldane'
    | 'establishment.branching'
    | 'establishment.copies'
    | 'establishment.releases'
    | 'time.establishment'
    | 'projection.inbreeding'
    | 'projection.heterozygosity'
    | 'projection.fitness'
    | 'projection.fitnessRatio'
    | 'migrants.effective'
    | 'migrants.rule'
    | 'outbreeding.level'
    | 'recipient.census'
    | 'recipient.effectiveSize'
    | 'recipient.generationTime'
    | 'recipient.initialInbreeding'
    | 'load.lethalEquivalents'
    | 'sensitivity.tornado'
    | 'sensitivity.heatmap'

export interface Explanation {
  id: ExplanationId
  /** What the number is, in a few words. */
  title: string
  /** How it is computed, in plain sentences. */
  method: string
  /** The formula in the usual notation, when there is one. */
  formula?: string
  /** What the method takes for granted. */
  assumptions: readonly string[]
  /** Papers (or "common practice, no source") behind the method. */
  citations: readonly string[]
  /** Cautions that always apply to this number (ids in shared/genetics/cautions.ts). */
  cautions: readonly CautionId[]
}

const KIMURA_1962 = 'Kimura M (1962) On the probability of fixation of mutant genes in a population. Genetics 47: 713–719.'
const KIMURA_1964 = 'Kimura M (1964) Diffusion models in population genetics. Journal of Applied Probability 1: 177–232 (Ne/N factor).'
const KIMURA_OHTA_1969 = 'Kimura M, Ohta T (1969) The average number of generations until fixation of a mutant gene in a finite population. Genetics 61: 763–771.'
const HALDANE_1927 = 'Haldane JBS (1927) A mathematical theory of natural and artificial selection, part V. Proceedings of the Cambridge Philosophical Society 23: 838–844.'
const WRIGHT_1931 = 'Wright S (1931) Evolution in Mendelian populations. Genetics 16: 97–159.'
const MORTON_1956 = 'Morton NE, Crow JF, Muller HJ (1956) An estimate of the mutational damage in man from data on consanguineous marriages. PNAS 42: 855–863.'
const MILLS_ALLENDORF_1996 = 'Mills LS, Allendorf FW (1996) The one-migrant-per-generation rule in conservation and management. Conservation Biology 10: 1509–1518.'
const VUCETICH_WAITE_2000 = 'Vucetich JA, Waite TA (2000) Is one migrant per generation sufficient for the genetic management of fluctuating populations? Animal Conservation 3: 261–266.'
const FRANKHAM_2011 = 'Frankham R, Ballou JD, Eldridge MDB, Lacy RC, Ralls K, Dudash MR, Fenster CB (2011) Predicting the probability of outbreeding depression. Conservation Biology 25: 465–475.'
const FRANKHAM_1995 = 'Frankham R (1995) Effective population size/adult population size ratios in wildlife: a review. Genetical Research 66: 95–107.'
const RALLS_1988 = 'Ralls K, Ballou JD, Templeton A (1988) Estimates of lethal equivalents and the cost of inbreeding in mammals. Conservation Biology 2: 185–193.'
const OGRADY_2006 = 'O\'Grady JJ, Brook BW, Reed DH, Ballou JD, Tonkyn DW, Frankham R (2006) Realistic levels of inbreeding depression strongly affect extinction risk in wild populations. Biological Conservation 133: 42–51.'
const EXACT_REFERENCE = 'Exact Wright–Fisher chain with selection, solved by subtraction-free state reduction (SCIENCE.md §2; checked against an independent high-precision computation).'

const COPIES_ASSUMPTION = 'The released animals are a random sample of a large, randomly mating source: each of their 2k gene copies carries the variant with probability q, independently.'
const JOIN_ASSUMPTION = 'Released animals join the N residents and breed like them; the census after a release is N + k, while drift acts at the recipient\'s Ne.'

/** Every explanation, by id. */
export const EXPLANATIONS: Readonly<Record<ExplanationId, Explanation>> = {
  'establishment.headline': {
    id: 'establishment.headline',
    title: 'Chance the variant establishes',
    method: `The probability that the variant carried by the released animals is not lost by chance but spreads to fixation in the recipient. Shown from the exact Wright–Fisher chain when Ne is at most ${EXACT_CHAIN_LIMIT} (the chain is more accurate for small populations and strong selection), otherwise from Kimura's diffusion. The chip under the figure says which.`,
    formula: 'P = 1 − (1 − P₁)^R,  P₁ = Σ_j P(J = j)·u(j),  J ~ Binomial(2k, q)',
    assumptions: [COPIES_ASSUMPTION, JOIN_ASSUMPTION, 'Releases count as independent chances (see "Several releases").', 'Constant Ne, s and h; random mating; one gene, not linked to other selected genes.'],
    citations: [KIMURA_1962, KIMURA_1964, EXACT_REFERENCE],
    cautions: ['constant-selection', 'effective-size-sets-drift', 'probability-display'],
  },
  'establishment.diffusion': {
    id: 'establishment.diffusion',
    title: 'Diffusion (Kimura) establishment probability',
    method: 'For j released copies the starting frequency is p = j / (2(N + k)); Kimura\'s diffusion gives the chance u(j) that they go on to fixation with drift at Ne. The engine integrates G(x) numerically in log space. The values are averaged over the number of copies a release carries and combined over the releases.',
    formula: 'u(p) = ∫₀ᵖ G(x)dx / ∫₀¹ G(x)dx,  G(x) = exp(−2·Ne·s·(2h·x + (1 − 2h)·x²))',
    assumptions: [COPIES_ASSUMPTION, JOIN_ASSUMPTION, 'Constant Ne over the whole period (use a harmonic mean if the size fluctuates).', 'Weak selection (|s| up to about 0.1); no further migration or mutation after the release.'],
    citations: [KIMURA_1962, KIMURA_1964],
    cautions: ['diffusion-assumptions', 'constant-selection', 'effective-size-sets-drift'],
  },
  'establishment.exact': {
    id: 'establishment.exact',
    title: 'Exact Wright–Fisher chain',
    method: `The exact generation-by-generation model is a population of M = round(Ne) individuals (it cannot represent Ne below the census otherwise). The released copies start at the census frequency p = j / (2(N + k)); one generation of selection and sampling of 2M genes takes the population into a state of the chain, whose fixation probability the engine solves exactly. When Ne equals the census after release this is the plain exact chain; when Ne is smaller it is the labelled approximation "chain of size round(Ne) started at the census frequency". Offered when M ≤ ${EXACT_CHAIN_LIMIT}; large chains are computed in the background.`,
    formula: 'u_exact(p) = Σ_i Binomial(2M, p′)(i)·U_i,  p′ = p(1 + s(p + h(1 − p))) / w̄',
    assumptions: [COPIES_ASSUMPTION, JOIN_ASSUMPTION, 'Wright–Fisher reproduction at M = round(Ne) individuals, selection on viability with fitnesses 1 + s : 1 + hs : 1.', 'Same combination of releases as the diffusion.'],
    citations: [EXACT_REFERENCE, 'SCIENCE.md §2.2 (chain of size round(Ne) as a labelled approximation when Ne < N).'],
    cautions: ['effective-size-sets-drift'],
  },
  'establishment.range': {
    id: 'establishment.range',
    title: 'Range over the plausible s and h',
    method: 'The diffusion result recomputed at every corner of the plausible ranges you gave for s and h (other inputs unchanged); the lowest and highest values are shown. It shows how much the unknown strength and dominance of selection matter, not a statistical confidence interval.',
    assumptions: ['The true s and h lie within the ranges entered.', 'Same model as the diffusion figure.'],
    citations: [KIMURA_1962],
    cautions: ['constant-selection'],
  },
  'establishment.haldane': {
    id: 'establishment.haldane',
    title: '"2hs" rule of thumb',
    method: 'Twice the heterozygote advantage, scaled by Ne/N, per introduced copy (in its saturating form 1 − e^(−2hs·Ne/N)), averaged over the copies a release carries and combined over releases. Shown beside the model value with its relative error; it is only trustworthy when h > 0, 4·Ne·h·s ≥ 10 and s ≤ 0.05.',
    formula: 'per copy: 1 − exp(−2·h·s·Ne/N);  one release: 1 − (1 − q·(1 − e^(−2hs·Ne/N)))^(2k)',
    assumptions: ['A rare allele in a large population; heterozygote advantage h·s > 0; weak selection.'],
    citations: [HALDANE_1927, KIMURA_1964],
    cautions: ['rule-of-thumb-only'],
  },
  'establishment.branching': {
    id: 'establishment.branching',
    title: 'Branching-process value',
    method: 'The chance that a single rare copy escapes early loss when each copy leaves a Poisson number of copies with mean 1 + h·s, averaged over the copies a release carries. It describes only the early phase in a very large population with Ne equal to the census — it ignores the Ne/N factor, so it overstates establishment where Ne is well below the census.',
    formula: '1 − π = exp(−(1 + h·s)·π)',
    assumptions: ['Very large population, Ne = N, allele rare, Poisson offspring numbers.'],
    citations: [HALDANE_1927],
    cautions: ['branching-early-phase-only'],
  },
  'establishment.copies': {
    id: 'establishment.copies',
    title: 'Copies of the variant per release',
    method: 'k animals carry 2k gene copies; each is the variant with the source frequency q, so the number of copies is Binomial(2k, q). The mean is 2kq and the chance that a release carries no copy at all is (1 − q)^(2k).',
    formula: 'P(J = j) = C(2k, j)·q^j·(1 − q)^(2k − j)',
    assumptions: [COPIES_ASSUMPTION],
    citations: ['Binomial sampling of gene copies (Hardy–Weinberg proportions in the source); common practice, no source.'],
    cautions: [],
  },
  'establishment.releases': {
    id: 'establishment.releases',
    title: 'Several releases (approximation)',
    method: 'Each release before the horizon is treated as an independent chance P₁ of establishing the variant, so the chance that at least one succeeds is 1 − (1 − P₁)^R. This is an approximation: it ignores copies from an earlier release still drifting when the next arrives (which helps a little), the growth of the census with each release, and releases after the variant has fixed. The stochastic simulation follows a schedule exactly.',
    formula: 'P = 1 − (1 − P₁)^R',
    assumptions: ['Independent releases, each into a population without the variant.', 'Releases at or after the horizon are not counted.'],
    citations: ['Approximation chosen for this tool (independent trials); common practice, no source.'],
    cautions: [],
  },
  'time.establishment': {
    id: 'time.establishment',
    title: 'Expected time to establishment',
    method: 'Kimura and Ohta\'s mean number of generations to fixation among the cases that do fix, for the copies a release carries (weighted by how much each copy number contributes to establishment; the most likely copy numbers, up to 16). With several releases the expected wait for the release that succeeds is added ("from the first release"). Years = generations × generation time.',
    formula: 't̄₁(p) = ∫ₚ¹ ψ(x)u(x)(1 − u(x))dx + ((1 − u(p))/u(p))·∫₀ᵖ ψ(x)u(x)²dx',
    assumptions: ['Diffusion model with the assumptions of the establishment figure.', 'A mean: individual outcomes vary widely.'],
    citations: [KIMURA_OHTA_1969],
    cautions: ['fixation-time-spread', 'fixation-time-horizon', 'generations-not-years'],
  },
  'projection.inbreeding': {
    id: 'projection.inbreeding',
    title: 'Projected inbreeding F',
    method: 'Expected inbreeding, generation by generation. Without releases F rises by drift at Ne. A release of a animals joins the parents of the next generation, who then carry a share m = a / (N + a) of unrelated genes, and F falls by the factor (1 − m)².',
    formula: 'F_t = (1 − m_t)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(t−1)]',
    assumptions: ['Released animals are unrelated to the recipient and breed like residents.', 'Constant Ne; neutral genes; ideal population apart from its size.', 'F is counted from today (F₀ = 0) unless a starting F is entered.'],
    citations: [WRIGHT_1931],
    cautions: ['island-model-assumptions', 'generations-not-years', 'per-generation-effective-size'],
  },
  'projection.heterozygosity': {
    id: 'projection.heterozygosity',
    title: 'Heterozygosity retained',
    method: 'Heterozygosity relative to today, (1 − F_t)/(1 − F₀), from the projected inbreeding. Above 1 means the releases bring in more diversity than drift removes.',
    formula: 'H_t / H_today = (1 − F_t)/(1 − F₀)',
    assumptions: ['As for projected inbreeding.'],
    citations: [WRIGHT_1931],
    cautions: ['island-model-assumptions'],
  },
  'projection.fitness': {
    id: 'projection.fitness',
    title: 'Expected relative fitness',
    method: 'Fitness of an average animal relative to a non-inbred one, from the projected F and the diploid lethal equivalents 2B (B = 2B / 2 per gamete). The band shows the low and high ends of the lethal-equivalent range.',
    formula: 'W / W₀ = exp(−B·F)',
    assumptions: ['Effects of inbreeding multiply across genes (log-linear in F).', 'No purging; the same environment throughout.'],
    citations: [MORTON_1956, RALLS_1988, OGRADY_2006],
    cautions: ['rescue-prediction-limits', 'lethal-equivalents-ploidy'],
  },
  'projection.fitnessRatio': {
    id: 'projection.fitnessRatio',
    title: 'Fitness with the releases ÷ without',
    method: 'The expected fitness at the horizon with the releases divided by the fitness without them — the "masking" of drift load by unrelated genes.',
    formula: 'W_with / W_without = exp(B·(F_without − F_with))',
    assumptions: ['As for relative fitness; ignores load carried by the source, outbreeding depression and demographic effects.'],
    citations: [MORTON_1956],
    cautions: ['rescue-prediction-limits'],
  },
  'migrants.effective': {
    id: 'migrants.effective',
    title: 'Effective migrants per generation',
    method: 'Animals released per generation while releases continue (k × generation time ÷ interval; a single release counts once), their share m of the breeding genes, m = a / (N + a), and the effective number Ne·m.',
    formula: 'Ne·m,  m = a / (N + a)',
    assumptions: ['Released animals survive and breed like residents (their breeding success is not known in advance).', 'Island model: a large, unrelated source.'],
    citations: [WRIGHT_1931, MILLS_ALLENDORF_1996],
    cautions: ['island-model-assumptions'],
  },
  'migrants.rule': {
    id: 'migrants.rule',
    title: 'One-migrant-per-generation rule of thumb',
    method: 'Compares the effective migrants per generation with the rule of thumb: at least 1 and at most 10 per generation as continuing gene flow. A single release is a one-off and does not meet a per-generation rule. Populations that fluctuate in size need more.',
    assumptions: ['The rule concerns effective migrants (Ne·m), not animals moved.'],
    citations: [MILLS_ALLENDORF_1996, VUCETICH_WAITE_2000],
    cautions: ['island-model-assumptions'],
  },
  'outbreeding.level': {
    id: 'outbreeding.level',
    title: 'Outbreeding-depression risk',
    method: 'The four-question screen: the risk is low only when the populations are the same species, have no fixed chromosomal differences, exchanged genes within the last 500 years and live in similar environments. Any other answer, including "not known", makes it elevated, and every reason is listed.',
    assumptions: ['Answers pre-filled from the records (years isolated, environment class, species) may be changed with a reason.'],
    citations: [FRANKHAM_2011],
    cautions: ['outbreeding-unknown-treated-as-elevated'],
  },
  'recipient.census': {
    id: 'recipient.census',
    title: 'Census N',
    method: 'Breeding adults in the recipient: the latest census count on its record, or the what-if value entered for this scenario. It sets the starting frequency of released copies and the share of released animals among the parents.',
    assumptions: ['Counts breeding adults, not all animals.'],
    citations: ['Record data entered by your agency.'],
    cautions: [],
  },
  'recipient.effectiveSize': {
    id: 'recipient.effectiveSize',
    title: 'Effective size Ne',
    method: 'The working Ne of the recipient\'s record (else its latest estimate, else 0.1 × the latest census), or the what-if value entered for this scenario. It sets the strength of drift.',
    assumptions: ['Ne per generation, constant over the horizon.'],
    citations: [FRANKHAM_1995],
    cautions: ['per-generation-effective-size', 'effective-size-sets-drift'],
  },
  'recipient.generationTime': {
    id: 'recipient.generationTime',
    title: 'Generation time',
    method: 'Mean age of parents when young are born, from the record or the what-if value; converts generations to years.',
    assumptions: ['Constant over the horizon.'],
    citations: ['Standard definition of generation length (SCIENCE.md §10).'],
    cautions: ['generations-not-years'],
  },
  'recipient.initialInbreeding': {
    id: 'recipient.initialInbreeding',
    title: 'Starting inbreeding F₀',
    method: 'Inbreeding today relative to the founding base. Records hold no pedigree F, so it is 0 (inbreeding counted from today) unless you enter a value for this scenario.',
    assumptions: ['Relative to the same base as the lethal-equivalent estimate.'],
    citations: [WRIGHT_1931],
    cautions: [],
  },
  'load.lethalEquivalents': {
    id: 'load.lethalEquivalents',
    title: 'Diploid lethal equivalents (2B)',
    method: 'How strongly fitness falls with inbreeding, per diploid individual. Defaults are cited: 12 for total fitness in the wild, 3.1 (median) or 4.6 (mean) for juvenile survival in captive mammals.',
    assumptions: ['Diploid figure (2B); the model uses B = 2B / 2.'],
    citations: [OGRADY_2006, RALLS_1988, MORTON_1956],
    cautions: ['lethal-equivalents-ploidy'],
  },
  'sensitivity.tornado': {
    id: 'sensitivity.tornado',
    title: 'Tornado: which uncertain input matters most',
    method: 'Each input is moved alone from the low to the high end of its plausible range while the others stay at their central values; the bar spans the results. Bars are sorted by their width. Inputs that do not enter a result are listed with "no effect". Establishment uses the diffusion. Ne ranges from half to twice the value in use unless it was derived from the census (then 0.05–0.3 × N).',
    assumptions: ['One input at a time: interactions are not shown (see the heat map for s with Ne).', 'The plausible ranges entered for s, h and lethal equivalents.'],
    citations: [KIMURA_1962, WRIGHT_1931, MORTON_1956, FRANKHAM_1995],
    cautions: ['constant-selection'],
  },
  'sensitivity.heatmap': {
    id: 'sensitivity.heatmap',
    title: 'Establishment over s and Ne',
    method: 'The diffusion establishment probability of the chosen variant (with this schedule) on a grid of s across its plausible range and Ne across its range on a logarithmic scale. The scenario\'s own values are marked.',
    assumptions: ['As for the diffusion establishment probability.'],
    citations: [KIMURA_1962, KIMURA_1964],
    cautions: ['effective-size-sets-drift'],
  },
}

/** All explanation ids. */
export const EXPLANATION_IDS = Object.keys(EXPLANATIONS) as ExplanationId[]

/**
 * Type guard for an explanation id (e.g. an id read from a template).
 *
 * @example isExplanationId('projection.inbreeding')  // true
 */
export function isExplanationId(value: string): value is ExplanationId {
  return Object.prototype.hasOwnProperty.call(EXPLANATIONS, value)
}

/** The statement shown wherever results are shown. */
export const DECISION_SUPPORT_STATEMENT = 'Results are decision support. Agency policy, permits and licensed practice govern any translocation.'
