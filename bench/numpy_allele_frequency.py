"""Vectorised numpy version of the one-locus allele-frequency model, for the
speed comparison in bench/simulate.bench.ts (not used by the app).

Same model as shared/genetics/simulate/establishment: one translocation event
of k animals drawn from a source at frequency q, added to N residents;
then every generation viability selection (fitnesses 1+s : 1+hs : 1) and
Wright-Fisher binomial sampling of round(2*Ne) genes; replicates that fix or
lose the allele are dropped from the arrays.

Usage: python3 bench/numpy_allele_frequency.py N Ne s h k q generations replicates seed
Prints one JSON line: replicate_generations, seconds (wall), cpu_seconds,
rate and cpu_rate (replicate-generations per second), established, lost.
"""
import json
import sys
import time

import numpy as np


def run(census, effective, s, h, migrants, source_frequency, generations, replicates, seed):
    rng = np.random.default_rng(seed)
    genes = max(1, round(2 * effective))
    started = time.perf_counter()
    cpu_started = time.process_time()
    copies = rng.binomial(2 * migrants, source_frequency, size=replicates)
    p = copies / (2 * census + 2 * migrants)
    established = 0
    lost = int(np.count_nonzero(p == 0))
    p = p[p > 0]
    replicate_generations = 0
    for _ in range(generations):
        if p.size == 0:
            break
        replicate_generations += p.size
        q = 1.0 - p
        mean_fitness = 1.0 + s * p * p + 2.0 * h * s * p * q
        selected = p * (1.0 + s * (p + h * q)) / mean_fitness
        counts = rng.binomial(genes, selected)
        fixed = counts == genes
        gone = counts == 0
        established += int(np.count_nonzero(fixed))
        lost += int(np.count_nonzero(gone))
        keep = ~(fixed | gone)
        p = counts[keep] / genes
    seconds = time.perf_counter() - started
    cpu_seconds = time.process_time() - cpu_started
    return {
        'replicate_generations': int(replicate_generations),
        'seconds': seconds,
        'cpu_seconds': cpu_seconds,
        'rate': replicate_generations / seconds if seconds > 0 else float('inf'),
        'cpu_rate': replicate_generations / cpu_seconds if cpu_seconds > 0 else float('inf'),
        'established': established,
        'lost': lost,
    }


if __name__ == '__main__':
    args = sys.argv[1:]
    if len(args) != 9:
        sys.exit(__doc__)
    census, effective = int(args[0]), float(args[1])
    s, h = float(args[2]), float(args[3])
    migrants, source_frequency = int(args[4]), float(args[5])
    generations, replicates, seed = int(args[6]), int(args[7]), int(args[8])
    print(json.dumps(run(census, effective, s, h, migrants, source_frequency, generations, replicates, seed)))
