# regen_extinction_fine.py: writes extinction_curves_fine.tsv (same folder), a
# full-precision companion of extinction_curves.tsv for synth/dust tests.
# Source of the values: Debian package python3-extinction (functions ccm89,
# odonnell94, fitzpatrick99 with a_v = 1, unit='aa'), made with version 0.4.6 and
# numpy 1.24.2 (versions written into the header). Laws: Cardelli, Clayton &
# Mathis 1989, ApJ 345, 245; O'Donnell 1994, ApJ 422, 158; Fitzpatrick 1999,
# PASP 111, 63 (revised optical anchors as packaged). Values are printed with
# 17 significant digits (round-trip exact doubles) so tests can compare at the
# 1e-12 level. Run with the system python3 that sees the package:
#     /usr/bin/python3 regen_extinction_fine.py
import os

import numpy as np
import extinction

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "extinction_curves_fine.tsv")

# Log-spaced wavelengths (A): 1000 A times 1.01^k up to 60000 A, plus the CCM
# piece boundaries x = 1.1, 3.3, 5.9, 8 per micron and the F99 knots/cut at 2700 A.
GRID = sorted(set([round(1000.0 * 1.01 ** k, 6) for k in range(0, 412)] +
                  [1e4 / 1.1, 1e4 / 3.3, 1e4 / 5.9, 1e4 / 8.0, 2700.0, 2600.0,
                   4110.0, 4670.0, 5470.0, 6000.0, 12200.0, 26500.0]))
LAWS = [  # (name, function, R_V, min A, max A); R_V 2.0 and 6.0 are the package's limits
    ("ccm89", extinction.ccm89, 2.0, 1000.0, 1e4 / 0.3),
    ("ccm89", extinction.ccm89, 2.5, 1000.0, 1e4 / 0.3),
    ("ccm89", extinction.ccm89, 3.1, 1000.0, 1e4 / 0.3),
    ("ccm89", extinction.ccm89, 5.0, 1000.0, 1e4 / 0.3),
    ("ccm89", extinction.ccm89, 6.0, 1000.0, 1e4 / 0.3),
    ("od94", extinction.odonnell94, 2.0, 1000.0, 1e4 / 0.3),
    ("od94", extinction.odonnell94, 2.5, 1000.0, 1e4 / 0.3),
    ("od94", extinction.odonnell94, 3.1, 1000.0, 1e4 / 0.3),
    ("od94", extinction.odonnell94, 5.0, 1000.0, 1e4 / 0.3),
    ("od94", extinction.odonnell94, 6.0, 1000.0, 1e4 / 0.3),
    ("f99", extinction.fitzpatrick99, 2.0, 1150.0, 6.0e4),
    ("f99", extinction.fitzpatrick99, 2.5, 1150.0, 6.0e4),
    ("f99", extinction.fitzpatrick99, 3.1, 1150.0, 6.0e4),
    ("f99", extinction.fitzpatrick99, 5.0, 1150.0, 6.0e4),
    ("f99", extinction.fitzpatrick99, 6.0, 1150.0, 6.0e4),
]


def main():
    lines = [
        "# extinction_curves_fine.tsv: A_lambda/A_V (a_v = 1) of ccm89, od94 and f99 at R_V 2.0, 2.5, 3.1, 5.0, 6.0 "
        "on %d wavelengths 1000-60000 A, 17 significant digits." % len(GRID),
        "# Obtained: computed with Debian package python3-extinction %s and numpy %s by "
        "regen_extinction_fine.py in this folder." % (extinction.__version__, np.__version__),
        "# Units: wavelength_aa in Angstrom (vacuum); value dimensionless. Rows only inside each law's range "
        "(ccm89/od94 1000-33333.3 A, f99 1150-60000 A).",
        "law\trv\twavelength_aa\ta_lambda_over_a_v",
    ]
    waves = np.array(GRID)
    for name, func, rv, lo, hi in LAWS:
        w = waves[(waves >= lo) & (waves <= hi)]
        vals = func(w, 1.0, rv, unit="aa")
        for wi, v in zip(w, vals):
            lines.append("%s\t%.1f\t%.17g\t%.17g" % (name, rv, wi, v))
    with open(OUT, "w") as fh:
        fh.write("\n".join(lines) + "\n")


if __name__ == "__main__":
    main()
