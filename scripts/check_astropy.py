#!/usr/bin/python3
"""Check that astropy reads starmock FITS and CSV (ECSV) catalogues correctly.

Usage:
    check_astropy.py [--fits FILE] [--csv FILE] [--manifest SIDECAR.json]
                     [--columns a,b,c] [--units u1,u2,u3] [--rows N]

The expected column names, units and row count come from the sidecar manifest
(`<file>.manifest.json`, written by starmock beside every output; by default the one
beside the first file given) unless --columns/--units/--rows override them. Units are
compared as astropy Unit objects, so "solMass" and "Msun" style spellings that astropy
treats as equal pass. When both files are given and have the same rows, their values are
compared column by column (floats bit for bit, nulls as NaN/masked).

Checks, each reported on its own line; the exit status is 1 if any fails, 2 on usage
errors:
  - astropy.table.Table.read opens the FITS file (first table HDU) and the CSV file
    (format="ascii.ecsv");
  - column names and order, units and row count match, and astropy recognises every
    unit string (IAU/FITS spellings such as solMass, solLum, mag, pc, yr);
  - the FITS primary header has ORIGIN = 'starmock' and SYNTHETC = T, and the MANIFEST
    extension holds valid JSON; the ECSV meta holds the manifest JSON;
  - only columns the manifest marks nullable contain nulls.

Tested with Debian 12 python3-astropy 5.2.1 and python3-numpy 1.24.2.
"""

import argparse
import json
import math
import sys
import warnings

import numpy as np
from astropy import units as u
from astropy.io import fits
from astropy.table import Table

failures = []


def check(ok, what):
    print(("ok    " if ok else "FAIL  ") + what)
    if not ok:
        failures.append(what)


def as_unit(s):
    if s is None or s == "":
        return None
    return u.Unit(s, parse_strict="silent")


def check_table(kind, path, tab, names, units, rows, nullable):
    check(list(tab.colnames) == names,
          f"{kind} {path}: columns {list(tab.colnames)} == {names}")
    check(len(tab) == rows, f"{kind} {path}: {len(tab)} rows == {rows}")
    for name, unit in zip(names, units):
        if name not in tab.colnames:
            continue
        got = tab[name].unit
        want = as_unit(unit)
        same = (got is None and want is None) or (got is not None and want is not None and got == want)
        check(same, f"{kind} {path}: column {name} unit {got!s} == {unit!r}")
        if got is not None and isinstance(got, u.UnrecognizedUnit):
            check(False, f"{kind} {path}: column {name} unit {unit!r} is not a unit astropy knows")
        col = tab[name]
        nnull = int(np.count_nonzero(col.mask)) if hasattr(col, "mask") and col.mask is not np.False_ else 0
        if nnull and not nullable.get(name, False):
            check(False, f"{kind} {path}: column {name} has {nnull} nulls but is not nullable")


def null_mask(col):
    data = np.asarray(col.data if not hasattr(col, "filled") else col.data.data)
    mask = np.zeros(len(col), dtype=bool)
    if hasattr(col, "mask") and col.mask is not np.False_:
        mask |= np.asarray(col.mask, dtype=bool)
    if data.dtype.kind == "f":
        mask |= np.isnan(data)
    return data, mask


def compare(ft, ct, names, nullable):
    for name in names:
        if name not in ft.colnames or name not in ct.colnames:
            continue
        fd, fm = null_mask(ft[name])
        cd, cm = null_mask(ct[name])
        if fd.dtype.kind == "b":
            # astropy 5.2 reads the FITS logical null (byte 0, Standard 4.0 7.3.3.1)
            # as False without a mask, so FITS bool nulls cannot be checked here.
            fm = cm.copy()
        same_null = np.array_equal(fm, cm)
        keep = ~(fm | cm)
        if fd.dtype.kind in "SU" or cd.dtype.kind in "SU":
            fv = np.char.rstrip(fd.astype(str)[keep])
            cv = cd.astype(str)[keep]
            same_val = np.array_equal(fv, cv)
        elif fd.dtype.kind == "f":
            same_val = np.array_equal(fd[keep].astype(cd.dtype), cd[keep])
        else:
            same_val = np.array_equal(fd[keep].astype(np.int64), cd[keep].astype(np.int64))
        check(same_null and same_val, f"fits vs csv: column {name} values and nulls agree")


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--fits")
    ap.add_argument("--csv")
    ap.add_argument("--manifest")
    ap.add_argument("--columns")
    ap.add_argument("--units")
    ap.add_argument("--rows", type=int)
    a = ap.parse_args()
    if not a.fits and not a.csv:
        ap.error("give --fits and/or --csv")
    man_path = a.manifest or ((a.fits or a.csv) + ".manifest.json")
    man = {}
    try:
        with open(man_path) as f:
            man = json.load(f)
    except OSError as e:
        if a.columns is None or a.rows is None:
            ap.error(f"cannot read manifest {man_path}: {e}; give --columns, --units and --rows")
    names = a.columns.split(",") if a.columns is not None else [c["name"] for c in man["columns"]]
    if a.units is not None:
        units = a.units.split(",")
    elif man:
        units = [c.get("unit", "") for c in man["columns"]]
    else:
        units = [""] * len(names)
    if len(units) != len(names):
        ap.error(f"{len(units)} units for {len(names)} columns")
    rows = a.rows if a.rows is not None else man["rows"]
    nullable = {c["name"]: c.get("nullable", False) for c in man.get("columns", [])}

    ft = ct = None
    if a.fits:
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", u.UnitsWarning)
                ft = Table.read(a.fits, format="fits")
            check(True, f"fits {a.fits}: astropy Table.read opened it")
        except Exception as e:  # noqa: BLE001 - report any reader failure
            check(False, f"fits {a.fits}: astropy Table.read failed: {e}")
        if ft is not None:
            check_table("fits", a.fits, ft, names, units, rows, nullable)
            with fits.open(a.fits) as hdul:
                h0 = hdul[0].header
                check(h0.get("ORIGIN") == "starmock", f"fits {a.fits}: ORIGIN = {h0.get('ORIGIN')!r}")
                check(h0.get("SYNTHETC") is True, f"fits {a.fits}: SYNTHETC = {h0.get('SYNTHETC')!r}")
                try:
                    m = json.loads(hdul["MANIFEST"].data.tobytes().decode("utf-8"))
                    check(m.get("rows") == rows, f"fits {a.fits}: MANIFEST extension JSON rows {m.get('rows')} == {rows}")
                except Exception as e:  # noqa: BLE001
                    check(False, f"fits {a.fits}: MANIFEST extension: {e}")
    if a.csv:
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", u.UnitsWarning)
                ct = Table.read(a.csv, format="ascii.ecsv")
            check(True, f"csv {a.csv}: astropy Table.read(format='ascii.ecsv') opened it")
        except Exception as e:  # noqa: BLE001
            check(False, f"csv {a.csv}: astropy Table.read failed: {e}")
        if ct is not None:
            check_table("csv", a.csv, ct, names, units, rows, nullable)
            try:
                m = json.loads(ct.meta["starmock.manifest"])
                check("synthetic" in m and m.get("tool") == "starmock",
                      f"csv {a.csv}: meta holds the starmock manifest")
            except Exception as e:  # noqa: BLE001
                check(False, f"csv {a.csv}: meta manifest: {e}")
    if ft is not None and ct is not None and len(ft) == len(ct):
        compare(ft, ct, names, nullable)
    print(f"{len(failures)} check(s) failed" if failures else "all checks passed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
