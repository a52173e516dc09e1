/**
 * Version of the stochastic simulation engine (shared/genetics/simulate), stored with every
 * simulation run so that a stored result can be reproduced exactly: the same model, parameters,
 * seed and replicates under the same engine version give the same result, bit for bit, whatever
 * the number of workers or threads.
 *
 * Bump it whenever a change under shared/genetics/simulate can change any result for a given
 * seed (a different random-number consumption, sampler, summary or default). Changes that keep
 * every result identical (speed-ups that draw the same numbers) keep the version.
 */
export const SIMULATION_ENGINE_VERSION = 'simulate-1.0.0'
