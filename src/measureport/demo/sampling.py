"""Random draws for the demo generator, built only on uniform numbers.

numpy keeps the bit stream of a seeded ``PCG64`` generator, and so of ``Generator.random``,
stable across releases; its other samplers may change. Every draw here is derived from
``random`` alone so that a seed gives the same data on every numpy version.
"""

from __future__ import annotations

import numpy as np
import numpy.typing as npt

FloatArray = npt.NDArray[np.float64]
IntArray = npt.NDArray[np.int64]


def new_generator(seed: int) -> np.random.Generator:
    """A seeded generator (PCG64)."""
    return np.random.Generator(np.random.PCG64(seed))


def uniform(rng: np.random.Generator, n: int) -> FloatArray:
    """``n`` numbers uniform on [0, 1)."""
    return rng.random(n)


def chance(rng: np.random.Generator, probability: float | FloatArray, n: int) -> npt.NDArray[np.bool_]:
    """``n`` coin flips, each true with ``probability`` (a number or one per flip)."""
    return uniform(rng, n) < probability


def weighted_choice(rng: np.random.Generator, weights: npt.ArrayLike, n: int) -> IntArray:
    """``n`` indices into ``weights``, each drawn with probability proportional to its weight."""
    cdf = np.cumsum(np.asarray(weights, dtype=np.float64))
    if cdf.size == 0 or cdf[-1] <= 0:
        raise ValueError("weighted_choice needs at least one positive weight")
    picks = np.searchsorted(cdf / cdf[-1], uniform(rng, n), side="right")
    return np.minimum(picks, cdf.size - 1).astype(np.int64)


def standard_normal(rng: np.random.Generator, n: int) -> FloatArray:
    """``n`` standard normal numbers (Box–Muller)."""
    radius = np.sqrt(-2.0 * np.log1p(-uniform(rng, n)))
    return radius * np.cos(2.0 * np.pi * uniform(rng, n))


def lognormal(rng: np.random.Generator, median: float | FloatArray, sigma: float, n: int) -> FloatArray:
    """``n`` log-normal numbers with the given median and log-scale spread."""
    return np.asarray(median, dtype=np.float64) * np.exp(sigma * standard_normal(rng, n))
