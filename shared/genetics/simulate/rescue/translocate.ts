import type { RandomStream } from '../random/streams'
import { uniformIndex } from '../random/uniform'
import type { GenomeArchitecture } from './architecture'
import { withFounders } from './pedigree'
import { allocatePopulation } from './population'
import type { Population } from './population'

/**
 * The recipient after a translocation event: its residents followed by
 * `count` animals chosen uniformly without replacement from the source's
 * current adults (partial Fisher–Yates shuffle), who join this generation's
 * breeding adults. Migrants keep their sex and genomes; the source is not
 * depleted (the animals are copied), i.e. the source is assumed large
 * relative to the number moved. For pedigree kinship migrants are founders:
 * unrelated to everyone, non-inbred (self-kinship ½).
 *
 * @param recipient - residents (not modified)
 * @param source - source adults (not modified)
 * @param count - animals moved, integer in [0, source.size]
 * @param architecture - genome layout
 * @param random - seeded generator
 * @returns a new population of recipient.size + count individuals
 */
export function withMigrants(recipient: Population, source: Population, count: number, architecture: GenomeArchitecture, random: RandomStream): Population {
  const size = recipient.size + count
  const joined = allocatePopulation(size, architecture)
  const { markerWords, loadWords } = architecture
  joined.male.set(recipient.male)
  joined.markers.set(recipient.markers)
  joined.load.set(recipient.load)
  joined.adaptive.set(recipient.adaptive)
  const order = Int32Array.from({ length: source.size }, (_, i) => i)
  for (let migrant = 0; migrant < count; migrant++) {
    const pick = migrant + uniformIndex(random, source.size - migrant)
    const chosen = order[pick] as number // pick < source.size
    order[pick] = order[migrant] as number
    order[migrant] = chosen
    const target = recipient.size + migrant
    joined.male[target] = source.male[chosen] as number
    joined.markers.set(source.markers.subarray(2 * chosen * markerWords, 2 * (chosen + 1) * markerWords), 2 * target * markerWords)
    joined.load.set(source.load.subarray(2 * chosen * loadWords, 2 * (chosen + 1) * loadWords), 2 * target * loadWords)
    joined.adaptive[2 * target] = source.adaptive[2 * chosen] as number
    joined.adaptive[2 * target + 1] = source.adaptive[2 * chosen + 1] as number
  }
  if (recipient.pedigree) joined.pedigree = withFounders(recipient.pedigree, count)
  return joined
}
