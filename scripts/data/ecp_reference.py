"""Independent reference values of effective-core-potential integrals, for the cases where psi4
1.3.2 is not accurate enough (see generate_ecp_fixture.py). Two methods, neither of which shares
code or algorithm with Tessera's ECP integrals (server/src/electronic/integrals/ecp/):

* `projection_block`: brute-force numerical quadrature about the ECP centre. The angular
  projections ∫ χ(r r̂) Y_lm(r̂) dΩ are done on a product grid (Gauss-Legendre in cos θ, equally
  spaced φ; real harmonics from scipy.special.sph_harm), the local part on the same 3D grid, and
  the radius by composite Gauss-Legendre. Converges exponentially for smooth functions; it cannot
  resolve functions much tighter than the angular grid spacing at their distance from the centre,
  so it is used only for blocks without such functions.
* `s_shell_diagonal`: for an s shell off the centre, the exact angular projection
  4π Σ c exp(−α(r² + a²)) i_l(2αar) Y_lm(â) (the plane-wave expansion) and a 1D integral in r with
  mpmath at 30 digits, with breakpoints around the shell's distance: exact up to the quadrature,
  for tight functions too.

Functions follow Tessera's conventions (tests compare cartesian blocks): primitives normalised as
in basis/build.ts, each cartesian component with unit norm.
"""

import json
import math
import os

import numpy as np
from numpy.polynomial.legendre import leggauss

BASIS_DIR = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "server", "src", "chemistry", "data", "basis-sets"))


def odd_double_factorial(n):
    """(2n-1)!!"""
    value = 1
    for k in range(2 * n - 1, 1, -2):
        value *= k
    return value


def normalized_coefficients(l, exponents, coefficients):
    c = [ci * (2 * a / math.pi) ** 0.75 * (4 * a) ** (l / 2) / math.sqrt(odd_double_factorial(l)) for a, ci in zip(exponents, coefficients)]
    n2 = sum(coefficients[i] * coefficients[j] * (2 * math.sqrt(exponents[i] * exponents[j]) / (exponents[i] + exponents[j])) ** (l + 1.5)
             for i in range(len(exponents)) for j in range(len(exponents)))
    return [x / math.sqrt(n2) for x in c]


def cartesian_exponents(l):
    return [(a, b, l - a - b) for a in range(l, -1, -1) for b in range(l - a, -1, -1)]


def load_element(basis, symbol):
    with open(os.path.join(BASIS_DIR, basis + ".json")) as handle:
        return json.load(handle)["elements"][symbol]


def molecule_shells(basis, atoms):
    """(l, exponents, normalised coefficients, centre) per shell, in Tessera's order."""
    shells = []
    for symbol, x, y, z in atoms:
        for l, exponents, coefficients in load_element(basis, symbol)["shells"]:
            shells.append((l, exponents, normalized_coefficients(l, exponents, coefficients), (x, y, z)))
    return shells


def real_harmonics(lmax, theta, phi):
    from scipy.special import sph_harm
    out = {}
    for l in range(lmax + 1):
        for m in range(-l, l + 1):
            y = sph_harm(abs(m), l, phi, theta)
            if m > 0:
                out[(l, m)] = math.sqrt(2) * (-1) ** m * y.real
            elif m < 0:
                out[(l, m)] = math.sqrt(2) * (-1) ** m * y.imag
            else:
                out[(l, m)] = y.real
    return out


def projection_block(basis, atoms, ecp_atom, p, q, radial_points=1200, polar=128, azimuthal=256, extra_channels=()):
    """Cartesian block <p|U_ECP(ecp_atom)|q> (unit-norm components) by product quadrature;
    `extra_channels` ([l, powers, exponents, coefficients]) are added to the element's potential."""
    shells = molecule_shells(basis, atoms)
    centre = np.array(atoms[ecp_atom][1:], dtype=float)
    channels = load_element(basis, atoms[ecp_atom][0])["ecp"]["channels"] + [list(channel) for channel in extra_channels]
    zeta_min = min(min(channel[2]) for channel in channels)
    r_max = math.sqrt(80.0 / zeta_min)
    xg, wg = leggauss(20)
    edges = np.linspace(0.0, r_max, radial_points // 20 + 1)
    radii = np.concatenate([0.5 * (b - a) * xg + 0.5 * (a + b) for a, b in zip(edges[:-1], edges[1:])])
    radial_weights = np.concatenate([0.5 * (b - a) * wg for a, b in zip(edges[:-1], edges[1:])])
    cos_theta, w_theta = leggauss(polar)
    phi = np.arange(azimuthal) * 2 * math.pi / azimuthal
    sin_theta = np.sqrt(1 - cos_theta ** 2)
    ux = np.outer(sin_theta, np.cos(phi))
    uy = np.outer(sin_theta, np.sin(phi))
    uz = np.outer(cos_theta, np.ones(azimuthal))
    w_angle = np.outer(w_theta, np.full(azimuthal, 2 * math.pi / azimuthal))
    harmonics = real_harmonics(max(channel[0] for channel in channels), np.arccos(np.clip(uz, -1, 1)), np.arctan2(uy, ux))

    def components(shell, r):
        l, exponents, coefficients, a = shell
        x = r * ux + centre[0] - a[0]
        y = r * uy + centre[1] - a[1]
        z = r * uz + centre[2] - a[2]
        r2 = x * x + y * y + z * z
        radial = sum(c * np.exp(-e * r2) for e, c in zip(exponents, coefficients))
        return [x ** i * y ** j * z ** k * radial for (i, j, k) in cartesian_exponents(l)]

    def potential(channel, r):
        return sum(d * r ** (n - 2) * math.exp(-z * r * r) for n, z, d in zip(channel[1], channel[2], channel[3]))

    a, b = shells[p], shells[q]
    na, nb = len(cartesian_exponents(a[0])), len(cartesian_exponents(b[0]))
    out = np.zeros((na, nb))
    for r, w in zip(radii, radial_weights):
        fa = components(a, r)
        fb = components(b, r)
        for channel in channels:
            u = w * r * r * potential(channel, r)
            if channel[0] < 0:
                for i in range(na):
                    for j in range(nb):
                        out[i, j] += u * np.sum(w_angle * fa[i] * fb[j])
            else:
                l = channel[0]
                for m in range(-l, l + 1):
                    y = harmonics[(l, m)]
                    pa = [np.sum(w_angle * f * y) for f in fa]
                    pb = [np.sum(w_angle * f * y) for f in fb]
                    out += u * np.outer(pa, pb)
    scale_a = [math.sqrt(odd_double_factorial(a[0]) / (odd_double_factorial(i) * odd_double_factorial(j) * odd_double_factorial(k))) for i, j, k in cartesian_exponents(a[0])]
    scale_b = [math.sqrt(odd_double_factorial(b[0]) / (odd_double_factorial(i) * odd_double_factorial(j) * odd_double_factorial(k))) for i, j, k in cartesian_exponents(b[0])]
    return (out * np.outer(scale_a, scale_b)).tolist()


def s_shell_diagonal(basis, atoms, ecp_atom, p):
    """<p|U_ECP|p> for an s shell p off the ECP centre, by exact projection and mpmath quadrature."""
    import mpmath as mp
    mp.mp.dps = 30
    l, exponents, coefficients, a_pos = molecule_shells(basis, atoms)[p]
    assert l == 0
    centre = atoms[ecp_atom][1:]
    a = mp.sqrt(sum((mp.mpf(a_pos[i]) - centre[i]) ** 2 for i in range(3)))
    channels = load_element(basis, atoms[ecp_atom][0])["ecp"]["channels"]

    def i_l(order, z):
        if z == 0:
            return mp.mpf(1) if order == 0 else mp.mpf(0)
        return mp.besseli(order + mp.mpf(1) / 2, z) * mp.sqrt(mp.pi / (2 * z))

    def potential(channel, r):
        return sum(d * r ** (n - 2) * mp.exp(-z * r * r) for n, z, d in zip(channel[1], channel[2], channel[3]))

    def projected(order, r):
        return sum(c * mp.exp(-e * (r * r + a * a)) * i_l(order, 2 * e * a * r) for e, c in zip(exponents, coefficients))

    points = [0, a / 4, a / 2, 3 * a / 4, a - mp.mpf("0.2"), a - mp.mpf("0.05"), a, a + mp.mpf("0.05"), a + mp.mpf("0.2"), a + 1, a + 3, a + 8]
    total = mp.mpf(0)
    for channel in channels:
        order = channel[0]
        if order < 0:
            # Local part: the angular integral of the product keeps only λ = 0 of its plane-wave expansion.
            def f(r, channel=channel):
                return r * r * potential(channel, r) * 4 * mp.pi * sum(
                    ci * cj * mp.exp(-(ei + ej) * (r * r + a * a)) * i_l(0, 2 * (ei + ej) * a * r)
                    for ei, ci in zip(exponents, coefficients) for ej, cj in zip(exponents, coefficients))
        else:
            # Σ_m Y_lm(â)² = (2l+1)/(4π)
            def f(r, channel=channel, order=order):
                return r * r * potential(channel, r) * (4 * mp.pi) ** 2 * (2 * order + 1) / (4 * mp.pi) * projected(order, r) ** 2
        total += mp.quad(f, points)
    return [[float(total)]]
