"""Independent oracle for tests/unit/treatment/porous.test.ts.

Run with Debian's Python (it has scipy): /usr/bin/python3 tests/reference/treatment_porous.py
Computes, with numpy complex arithmetic and scipy.integrate.quad over the incidence angle:
  - normal-incidence absorption of a Delany-Bazley / Miki layer on a rigid wall,
  - the same layer with an air gap (impedance translation through the gap and the layer),
  - random-incidence absorption by Paris' formula, integrated over theta (not over cos theta).
Time convention e^{+j omega t}; rho0 = 1.21 kg/m3, c0 = 343 m/s.
"""
import numpy as np
from scipy.integrate import quad

RHO0, C0 = 1.21, 343.0
Z0 = RHO0 * C0


def delany_bazley(f, sigma):
    x = RHO0 * f / sigma
    zc = Z0 * (1 + 0.0571 * x**-0.754 - 1j * 0.087 * x**-0.732)
    k = 2 * np.pi * f / C0 * (1 + 0.0978 * x**-0.700 - 1j * 0.189 * x**-0.595)
    return zc, k


def miki(f, sigma):
    r = f / sigma
    zc = Z0 * (1 + 0.0699 * r**-0.632 - 1j * 0.107 * r**-0.632)
    k = 2 * np.pi * f / C0 * (1 + 0.109 * r**-0.618 - 1j * 0.160 * r**-0.618)
    return zc, k


def surface_impedance(model, f, sigma, d, gap=0.0):
    zc, k = model(f, sigma)
    if gap == 0.0:
        return -1j * zc / np.tan(k * d)
    zb = -1j * Z0 / np.tan(2 * np.pi * f / C0 * gap)
    return zc * (zb * np.cos(k * d) + 1j * zc * np.sin(k * d)) / (zc * np.cos(k * d) + 1j * zb * np.sin(k * d))


def alpha_theta(zs, theta):
    zt = zs * np.cos(theta)
    return 1 - abs((zt - Z0) / (zt + Z0)) ** 2


def alpha_random(zs):
    val, _ = quad(lambda t: alpha_theta(zs, t) * np.sin(2 * t), 0, np.pi / 2, epsabs=1e-13, epsrel=1e-12)
    return val


bands = [125, 250, 500, 1000, 2000, 4000]
for name, model in (("delany-bazley", delany_bazley), ("miki", miki)):
    a0 = [alpha_theta(surface_impedance(model, f, 10000.0, 0.05), 0.0) for f in bands]
    ar = [alpha_random(surface_impedance(model, f, 10000.0, 0.05)) for f in bands]
    ag = [alpha_random(surface_impedance(model, f, 10000.0, 0.05, 0.1)) for f in bands]
    print(name, "normal, 50 mm rigid:", " ".join(f"{v:.6f}" for v in a0))
    print(name, "random, 50 mm rigid:", " ".join(f"{v:.6f}" for v in ar))
    print(name, "random, 50 mm + 100 mm gap:", " ".join(f"{v:.6f}" for v in ag))
for zeta in (1.0, 1.567, 3.0, 10.0):
    print(f"real zeta {zeta}: quad {alpha_random(zeta * Z0):.8f}")
