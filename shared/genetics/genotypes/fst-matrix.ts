import { domainError } from '../validate'
import { tallyLoci } from './locus-tally'
import { type FstMethod, type FstOptions, fstFromTallies, requireFstMethod } from './pairwise-fst'
import type { NamedGenotypeDataset } from './types'
import { requireValidGenotypeDataset } from './validate-dataset'

/** Result of `fstMatrix`: `values[i][j]` is F_ST between `names[i]` and `names[j]`. */
export interface FstMatrix {
  method: FstMethod
  names: string[]
  /** symmetric; diagonal 0 by definition (not estimated); null where `pairwiseFst` gives null */
  values: (number | null)[][]
}

/**
 * Multi-locus F_ST for every pair of populations, as a symmetric matrix.
 *
 * Why: the workspace shows which subpopulations are most differentiated, to
 * pick sources for genetic rescue.
 *
 * Each off-diagonal entry is `pairwiseFst(datasetᵢ, datasetⱼ, options).fst`
 * (see there for formulas, missing data and skipped loci); entry [j][i]
 * copies [i][j], so the matrix is exactly symmetric. The diagonal is 0 by
 * definition: the estimators applied to a sample and itself give small
 * negative values, which are not meaningful. Each dataset is tallied once.
 * Cost O(k² · loci · alleles) for k populations.
 *
 * @param datasets - populations with unique non-empty names (any number, 0 gives an empty matrix)
 * @param options.method - 'hudson' or 'weir-cockerham'
 * @returns names in input order and the k × k matrix
 * @throws RangeError for duplicate names, an unknown method or an invalid dataset
 * @example fstMatrix([{ name: 'Alder Hollow', dataset: alderHollow }, { name: 'Cinder Flats', dataset: cinderFlats }],
 *   { method: 'hudson' }).values  // [[0, 0.25441948351879073], [0.25441948351879073, 0]]
 */
export function fstMatrix(datasets: readonly NamedGenotypeDataset[], options: FstOptions): FstMatrix {
  const fn = 'fstMatrix'
  requireFstMethod(fn, options?.method)
  const names = datasets.map(entry => entry.name)
  const seen = new Set<string>()
  for (const name of names) {
    if (typeof name !== 'string' || name.trim() === '') domainError(fn, 'datasets[].name', 'non-empty text', name)
    if (seen.has(name)) domainError(fn, 'datasets[].name', 'unique', name)
    seen.add(name)
  }
  datasets.forEach((entry, index) => requireValidGenotypeDataset(fn, `datasets[${index}].dataset`, entry.dataset))
  const tallies = datasets.map(entry => tallyLoci(entry.dataset))
  const values: (number | null)[][] = names.map(() => names.map(() => 0))
  tallies.forEach((rowTallies, row) => {
    for (let column = row + 1; column < tallies.length; column++) {
      const columnTallies = tallies[column] ?? []
      const fst = fstFromTallies(rowTallies, columnTallies, options.method).fst
      const upper = values[row]
      const lower = values[column]
      if (upper) upper[column] = fst
      if (lower) lower[row] = fst
    }
  })
  return { method: options.method, names, values }
}
