#!/usr/bin/env python3
"""Reference blackbody bolometric corrections on the AB scale for the built-in passbands.

Writes blackbody_bc_ab.tsv next to this script. Independent of the Go code: the
Planck function is astropy's BlackBody model, the passbands are read from
../data/passbands/*.tsv, interpolated linearly with numpy.interp onto a 0.5 angstrom
grid and integrated with numpy.trapz.

  BC_AB = m_bol - m_AB,  m_bol = -2.5 log10(sigma T^4 / f0),  f0 = 2.518021002e-8 W m^-2 (IAU 2015 B2)
  m_AB  = -2.5 log10( Int F_lambda S lambda dlambda / Int (3631 Jy c / lambda^2) S lambda dlambda ),
  F_lambda = pi B_lambda(T); S = T for response_kind photon, S = T / lambda for energy.

Run with Debian python3 (python3-astropy 5.2.1, python3-numpy 1.24.2):
    /usr/bin/python3 regen_blackbody_bc.py
"""
import glob
import os

import astropy
import numpy as np
from astropy import units as u
from astropy.constants import sigma_sb, c
from astropy.modeling.models import BlackBody

HERE = os.path.dirname(os.path.abspath(__file__))
F0 = 2.518021002e-8  # W m^-2
TEMPS = [3000.0, 5772.0, 10000.0, 30000.0]
NAMES = {"johnson_cousins_U": "U", "johnson_cousins_B": "B", "johnson_cousins_V": "V",
         "johnson_cousins_R": "Rc", "johnson_cousins_I": "Ic", "twomass_J": "J", "twomass_H": "H",
         "twomass_Ks": "Ks", "sdss_u": "u", "sdss_g": "g", "sdss_r": "r", "sdss_i": "i", "sdss_z": "z",
         "gaia_dr3_G": "G", "gaia_dr3_BP": "BP", "gaia_dr3_RP": "RP"}


def read(path):
    kind, lam, thr, names = None, [], [], False
    for line in open(path, encoding="utf-8"):
        s = line.strip()
        if not s:
            continue
        if s.startswith("#"):
            body = s.lstrip("#").strip()
            if body.startswith("response_kind:"):
                kind = body.split(":", 1)[1].split()[0]
            continue
        if not names:
            names = True
            continue
        a, b = s.split("\t")[:2]
        lam.append(float(a))
        thr.append(float(b))
    return np.array(lam), np.array(thr), kind


def main():
    out = [
        "# blackbody_bc_ab.tsv: bolometric correction BC_AB = m_bol - m_AB of a blackbody through each built-in passband (16 bands x 4 temperatures).",
        "# Made by regen_blackbody_bc.py (this folder) with astropy %s BlackBody and numpy %s (interp onto 0.5 angstrom steps, trapz)." % (astropy.__version__, np.__version__),
        "# m_bol on the IAU 2015 B2 scale (f0 = 2.518021002e-8 W m^-2); AB zero point 3631 Jy; photon-counting integrals per response_kind.",
        "# Units: temperature_k in K; bc_ab in mag.",
        "band\ttemperature_k\tbc_ab",
    ]
    for path in sorted(glob.glob(os.path.join(HERE, "..", "data", "passbands", "*.tsv"))):
        base = os.path.basename(path)[:-4]
        if base not in NAMES:
            continue
        lam, thr, kind = read(path)
        grid = np.arange(lam[0], lam[-1] + 0.25, 0.5)
        t = np.interp(grid, lam, thr)
        s = t if kind == "photon" else t / grid
        for temp in TEMPS:
            bb = BlackBody(temperature=temp * u.K, scale=1.0 * u.W / (u.m ** 2 * u.m * u.sr))
            flam = np.pi * bb(grid * u.AA).to_value(u.W / (u.m ** 2 * u.m * u.sr))
            fab = 3631e-26 * c.value / (grid * 1e-10) ** 2
            num = np.trapz(flam * s * grid, grid)
            den = np.trapz(fab * s * grid, grid)
            mab = -2.5 * np.log10(num / den)
            mbol = -2.5 * np.log10(sigma_sb.value * temp ** 4 / F0)
            out.append("%s\t%g\t%.7f" % (NAMES[base], temp, mbol - mab))
    with open(os.path.join(HERE, "blackbody_bc_ab.tsv"), "w") as f:
        f.write("\n".join(out) + "\n")


if __name__ == "__main__":
    main()
