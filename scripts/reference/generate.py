#!/usr/bin/env python3
"""
Reference values for the cooldown engine's tests, computed with mpmath at 40 digits
and written (to 30 significant digits) to tests/fixtures/reference-values.json.

The tests read the committed JSON and need no Python; run this only to regenerate:
    npm run reference:generate
Needs Python 3 and mpmath (Debian: apt-get install python3-mpmath).

Everything here is computed from the defining equations with mpmath's own functions
(besselj, besseljzero) and bisection in its arithmetic, not from the engine, so a fault in the engine
cannot hide in both its answer and the value it is checked against.
"""
import datetime
import json
import pathlib
import platform

import mpmath
from mpmath import mp, mpf

mp.dps = 40
DIGITS = 30

BIOT_GRID = ['0.0001', '0.01', '0.05', '0.1', '0.5', '1', '2', '5', '7', '10', '100', '10000']
ROOTS_PER_BIOT = 6
BESSEL_POINTS = ['0.5', '1', '2', '2.5', '5', '10', '20']
BESSEL_ZEROS = 10
SERIES_BIOT = ['0.1', '1', '10', 'inf']
SERIES_FOURIER = ['0.05', '0.2', '1']
FIXED_SURFACE_POINTS = ['0', '0.5', '0.9']
FIXED_SURFACE_FOURIER = ['0.02', '0.1', '0.5']


def text(value):
    return mpmath.nstr(value, DIGITS, min_fixed=-5, max_fixed=6)


def bracketed_root(f, a, b):
    """The single root of f in [a, b]; refuses a bracket without a sign change."""
    fa, fb = f(a), f(b)
    if fa == 0:
        return a
    if fb == 0:
        return b
    if mpmath.sign(fa) == mpmath.sign(fb):
        raise ValueError(f'no sign change on [{a}, {b}]')
    # Bisection: slow but certain, and 40 digits need only ~140 halvings.
    while b - a > mpf(10) ** (-mp.dps) * max(1, abs(a)):
        middle = (a + b) / 2
        fm = f(middle)
        if fm == 0:
            return middle
        if mpmath.sign(fm) == mpmath.sign(fa):
            a, fa = middle, fm
        else:
            b = middle
    return (a + b) / 2


def j0_zero(n):
    return mpmath.besseljzero(0, n)


def j1_zero(n):
    """n-th positive zero of J1, with j1,0 = 0."""
    return mpf(0) if n == 0 else mpmath.besseljzero(1, n)


# Characteristic equations of a symmetric body with surface Biot number Bi, each
# root bracketed in its own interval (the fixed-surface roots bound them above).
def slab_root(n, bi):
    # λ tan λ = Bi, written λ sin λ − Bi cos λ = 0 on [(n − 1)π, (n − ½)π].
    return bracketed_root(lambda z: z * mpmath.sin(z) - bi * mpmath.cos(z), (n - 1) * mp.pi, (n - mpf('0.5')) * mp.pi)


def rod_root(n, bi):
    # λ J1(λ)/J0(λ) = Bi, written λ J1 − Bi J0 = 0 between j1,n−1 and j0,n.
    return bracketed_root(lambda z: z * mpmath.besselj(1, z) - bi * mpmath.besselj(0, z), j1_zero(n - 1), j0_zero(n))


def sphere_root(n, bi):
    # 1 − λ cot λ = Bi, written cos λ + (Bi − 1) sin λ/λ = 0 on [(n − 1)π, nπ].
    return bracketed_root(lambda z: mpmath.cos(z) + (bi - 1) * mpmath.sinc(z), (n - 1) * mp.pi, n * mp.pi)


def fixed_root(geometry, n):
    if geometry == 'slab':
        return (n - mpf('0.5')) * mp.pi
    if geometry == 'rod':
        return j0_zero(n)
    return n * mp.pi


ROOT = {'slab': slab_root, 'rod': rod_root, 'sphere': sphere_root}


def root(geometry, n, bi):
    return fixed_root(geometry, n) if bi == mpmath.inf else ROOT[geometry](n, bi)


def coefficient(geometry, z):
    """C_n of a uniform initial excess, centre value of the mode 1."""
    if geometry == 'slab':
        return 4 * mpmath.sin(z) / (2 * z + mpmath.sin(2 * z))
    if geometry == 'rod':
        j0, j1 = mpmath.besselj(0, z), mpmath.besselj(1, z)
        return (2 / z) * j1 / (j0 ** 2 + j1 ** 2)
    return 4 * (mpmath.sin(z) - z * mpmath.cos(z)) / (2 * z - mpmath.sin(2 * z))


def shape(geometry, z, x):
    if geometry == 'slab':
        return mpmath.cos(z * x)
    if geometry == 'rod':
        return mpmath.besselj(0, z * x)
    return mpmath.sinc(z * x)


def series(geometry, bi, fo, x=0):
    """Σ C_n f_n(x) e^{−λ_n² Fo}, summed until a term falls below 10^−(dps + 2)."""
    total = mpf(0)
    n = 1
    while True:
        z = root(geometry, n, bi)
        term = coefficient(geometry, z) * shape(geometry, z, x) * mpmath.exp(-z * z * fo)
        total += term
        # |C_n| ≤ 2 and |f_n| ≤ 1, so once e^{−λ_n² Fo} is negligible so is the rest (λ_n grows like nπ).
        if 2 * mpmath.exp(-z * z * fo) < mpf(10) ** -(mp.dps + 2):
            return total, n
        n += 1


def fixed_surface_sphere_sine_series(x, fo):
    """Σ 2(−1)^{n+1} sin(nπx)/(nπx) e^{−n²π²Fo}: a sphere whose surface is held from t = 0."""
    total = mpf(0)
    n = 1
    while True:
        decay = mpmath.exp(-(n * mp.pi) ** 2 * fo)
        total += 2 * (-1) ** (n + 1) * mpmath.sinc(n * mp.pi * x) * decay
        if 2 * decay < mpf(10) ** -(mp.dps + 2):
            return total
        n += 1


def biot_roots():
    out = {}
    for geometry in ROOT:
        rows = []
        for bi_text in BIOT_GRID:
            bi = mpf(bi_text)
            roots = [root(geometry, n, bi) for n in range(1, ROOTS_PER_BIOT + 1)]
            rows.append({
                'bi': bi_text,
                'roots': [text(z) for z in roots],
                'coefficients': [text(coefficient(geometry, z)) for z in roots],
            })
        out[geometry] = rows
    return out


def centre_series():
    out = {}
    for geometry in ROOT:
        rows = []
        for bi_text in SERIES_BIOT:
            bi = mpmath.inf if bi_text == 'inf' else mpf(bi_text)
            for fo_text in SERIES_FOURIER:
                value, terms = series(geometry, bi, mpf(fo_text))
                rows.append({'bi': bi_text, 'fo': fo_text, 'centreRatio': text(value), 'terms': terms})
        out[geometry] = rows
    return out


def main():
    fixture = {
        'header': {
            'generator': 'scripts/reference/generate.py',
            'library': f'mpmath {mpmath.__version__}',
            'python': platform.python_version(),
            'workingDigits': mp.dps,
            'writtenDigits': DIGITS,
            'generated': datetime.date.today().isoformat(),
            'note': 'Values are decimal strings; read them with Number(). Regenerate with npm run reference:generate.',
        },
        'besselValues': [
            {'x': x, 'J0': text(mpmath.besselj(0, mpf(x))), 'J1': text(mpmath.besselj(1, mpf(x)))} for x in BESSEL_POINTS
        ],
        'besselZeros': {
            'J0': [text(j0_zero(n)) for n in range(1, BESSEL_ZEROS + 1)],
            'J1': [text(j1_zero(n)) for n in range(1, BESSEL_ZEROS + 1)],
        },
        'biotRoots': biot_roots(),
        'centreSeries': centre_series(),
        'fixedSurfaceSphere': [
            {'x': x, 'fo': fo, 'ratio': text(fixed_surface_sphere_sine_series(mpf(x), mpf(fo)))}
            for x in FIXED_SURFACE_POINTS
            for fo in FIXED_SURFACE_FOURIER
        ],
    }
    target = pathlib.Path(__file__).resolve().parents[2] / 'tests' / 'fixtures' / 'reference-values.json'
    target.parent.mkdir(parents=True, exist_ok=True)
    target.write_text(json.dumps(fixture, indent=2, ensure_ascii=False) + '\n')
    print(f'wrote {target}')


if __name__ == '__main__':
    main()
