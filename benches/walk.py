#!/usr/bin/env python3
"""The yardstick for `reeve spread` on the 20-passage tackle: the same Monte Carlo study
written as a short numpy walk, timed.

Usage (needs numpy: `pip install numpy`):

    python3 benches/walk.py                       # 1e5 samples, seed 1, best of 5 runs
    python3 benches/walk.py --samples 1000000 --seed 7 --runs 3

It prints the time of one study (drawing the samples and walking the tackle for each;
the best of `--runs` and the first, after numpy is imported) and the P5 / P50 / P95 of the forward
and back pull, to set beside

    reeve spread RIG --samples 100000 --seed 1

where RIG is `ranged_tackle()` of `tests/it/support/generators.rs` (`benches/scale.rs`
writes and times it as the `spread` family). The percentiles agree to sampling error, not to the
digit: the two draw different random numbers. The whole process, start-up included, is
`/usr/bin/time -f '%e s %M KiB' python3 benches/walk.py`.

The tackle (mirrors `ranged_tackle()`): 20 rated sheaves, alternately on the hook block
and fixed above, falls vertical (wrap 180 degrees at each), dead end on the fixed block,
hauling part leaving the last fixed sheave: all 20 parts between the dead end and the
last sheave hold the hook. Each sheave's factor K is uniform in [1.02, 1.06]; the hook
load is normal, mean 500 kg, sd 25 kg, truncated at zero (resampled), as `spread` draws
them. The walk (DESIGN.md section 1, rated sheave at 180 degrees: tension ratio K):
going forward the rope runs from the dead end to the hand, so with T0 the dead-end part,
T(j+1) = K(j) * T(j); the hook's equilibrium W = T0 + ... + T19 fixes T0, and the pull
is T20. Running back every ratio is inverted. With every K = 1.04 this is the handbook
reeving formula, W * K^20 * (K - 1) / (K^20 - 1) = 360.8 N.
"""

import argparse
import signal
import time

import numpy as np

G = 9.80665  # standard gravity, m/s^2
SHEAVES = 20
FACTOR_MIN, FACTOR_MAX = 1.02, 1.06
LOAD_MEAN_KG, LOAD_SD_KG = 500.0, 25.0


def draw(rng, samples):
    """Sheave factors (samples x SHEAVES) and hook weights in N (samples)."""
    factors = rng.uniform(FACTOR_MIN, FACTOR_MAX, size=(samples, SHEAVES))
    mass = rng.normal(LOAD_MEAN_KG, LOAD_SD_KG, size=samples)
    negative = mass < 0.0
    while negative.any():  # truncated at zero by rejection
        mass[negative] = rng.normal(LOAD_MEAN_KG, LOAD_SD_KG, size=negative.sum())
        negative = mass < 0.0
    return factors, mass * G


def walk(ratios, weight):
    """Pull at the hand for every sample: walk the fall passage by passage from the
    dead end with T0 = 1, then scale so that the 20 hook parts carry the weight."""
    tension = np.ones(len(weight))
    carried = np.zeros(len(weight))
    for j in range(SHEAVES):
        carried += tension  # part j holds the hook
        tension = tension * ratios[:, j]  # over sheave j
    return weight * tension / carried


def study(samples, seed):
    rng = np.random.default_rng(seed)
    factors, weight = draw(rng, samples)
    return walk(factors, weight), walk(1.0 / factors, weight)


def main():
    signal.signal(signal.SIGPIPE, signal.SIG_DFL)  # quiet when piped into `head`
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--samples", type=int, default=100_000)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--runs", type=int, default=5)
    args = parser.parse_args()
    times = []
    for _ in range(max(args.runs, 1)):
        start = time.perf_counter()
        forward, back = study(args.samples, args.seed)
        times.append(time.perf_counter() - start)
    best = min(times)
    nominal = walk(np.full((1, SHEAVES), 1.04), np.array([LOAD_MEAN_KG * G]))[0]
    print(
        f"numpy walk of the {SHEAVES}-passage tackle: {args.samples} samples in "
        f"{best:.3f} s (best of {len(times)}; {args.samples / best:,.0f} samples/s; "
        f"first run {times[0]:.3f} s)"
    )
    print(f"nominal forward {nominal:.1f} N")
    for name, pull in (("forward", forward), ("back", back)):
        p5, p50, p95 = np.percentile(pull, [5, 50, 95])
        print(f"{name:<8} P5 {p5:.1f} N  P50 {p50:.1f} N  P95 {p95:.1f} N")


if __name__ == "__main__":
    main()
