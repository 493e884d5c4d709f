#!/usr/bin/python3
"""Writes FITS and VOTable fixtures for SizeTest's catalogue readers with an independent
writer: astropy (Debian python3-astropy; run with /usr/bin/python3).

    /usr/bin/python3 make_fits_fixtures.py

Outputs (all synthetic values, invented for the test):
  fixture_tables.fits      primary HDU + BINTABLE 'GALAXIES' (every TFORM type L B I J K A E D,
                           a 3E vector, scaled integers, unsigned 16-bit via TZERO, TNULL nulls,
                           NaN nulls, a blank string, a long CONTINUE'd header string)
                           + BINTABLE 'RADIO' (a second extension)
                           + BINTABLE 'ODD' (X, C, PJ with a heap, a 100E vector: listed, not mapped)
  fixture_tables.json      the values astropy reads back (null = null), plus the library version
  fixture_tabledata.vot    the 'GALAXIES' scalar columns as VOTable TABLEDATA
  fixture_binary2.vot      the same as VOTable BINARY2
"""
import json
import math
import numpy as np
import astropy
from astropy.io import fits
from astropy.table import Table, MaskedColumn
from astropy.io.votable import from_table, writeto

N = 6
z = np.array([0.1, 0.5, 1.0, 1.5, 2.25, 3.0])
theta = np.array([2.5, 1.2, 0.8, np.nan, 0.45, 0.3])            # arcsec, NaN = null (row 4)
theta_err = np.array([0.1, 0.05, 0.04, 0.03, 0.02, 0.01], dtype=np.float32)
mu_raw = np.array([2100, 2215, 2340, 2405, 2511, 2600], dtype=np.int16)   # stored; TSCAL 0.01, TZERO 0
mu_scale, mu_zero = 0.01, 0.0
mag_raw = np.array([-500, -250, 0, 250, 500, -32768 + 5], dtype=np.int32)  # TSCAL 0.002 TZERO 22
mag_scale, mag_zero = 0.002, 22.0
nobj = np.array([7, -2147483647, 42, 0, -999, 123456789], dtype=np.int32)  # TNULL -999 (row 5)
big = np.array([2**40 + 1, -(2**50), 0, 9007199254740993, -1, 17], dtype=np.int64)  # TNULL -1 (row 5)
flag = np.array([True, False, True, True, False, True])
quality = np.array([0, 1, 2, 255, 254, 7], dtype=np.uint8)          # TNULL 255 (row 4)
counts = np.array([0, 1, 32767, 32768, 65535, 40000], dtype=np.uint16)  # astropy writes I + TZERO 32768
name = np.array(["G-1", "G-2", "", "G 4", "G-5", "G-6"])            # 10A; blank = null (row 3)
flux = np.array([[1, 2, 3], [4, 5, 6], [7, 8, 9], [10, 11, np.nan], [13, 14, 15], [16, 17, 18]], dtype=np.float32)

cols = [
    fits.Column(name="ID", format="10A", array=name),
    fits.Column(name="z", format="D", array=z),
    fits.Column(name="theta", format="D", unit="arcsec", array=theta),
    fits.Column(name="theta_err", format="E", unit="arcsec", array=theta_err),
    fits.Column(name="mu", format="I", unit="mag/arcsec2", array=mu_raw),   # TSCAL/TZERO added below
    fits.Column(name="mag", format="J", unit="mag", array=mag_raw),          # TSCAL/TZERO added below
    fits.Column(name="nobj", format="J", null=-999, array=nobj),
    fits.Column(name="big", format="K", null=-1, array=big),
    fits.Column(name="flag", format="L", array=flag),
    fits.Column(name="quality", format="B", null=255, array=quality),
    fits.Column(name="counts", format="I", bzero=32768, array=counts),
    fits.Column(name="flux", format="3E", array=flux),
]
gal = fits.BinTableHDU.from_columns(cols, name="GALAXIES")
gal.header["LONGSTR"] = "This synthetic fixture has a deliberately long string value so that astropy must continue it over CONTINUE cards in the header."
radio = fits.BinTableHDU.from_columns([
    fits.Column(name="zspec", format="D", array=np.array([0.7, 1.9])),
    fits.Column(name="FWHM", format="E", unit="mas", array=np.array([1.25, 0.5], dtype=np.float32)),
], name="RADIO")
# A third table with types SizeTest lists but cannot map: bits (X), complex (C), a variable-length
# array with a heap (PJ), and a vector longer than 64 elements.
odd = fits.BinTableHDU.from_columns([
    fits.Column(name="bits", format="12X", array=np.array([[True] * 12, [False] * 12, [True, False] * 6])),
    fits.Column(name="cplx", format="C", array=np.array([1 + 2j, 3 - 4j, 0j], dtype=np.complex64)),
    fits.Column(name="vla", format="PJ()", array=np.array([np.array([1, 2, 3], dtype=np.int32), np.array([], dtype=np.int32), np.array([7], dtype=np.int32)], dtype=object)),
    fits.Column(name="wide", format="100E", array=np.arange(300, dtype=np.float32).reshape(3, 100)),
    fits.Column(name="z", format="D", array=np.array([0.3, 0.6, 0.9])),
], name="ODD")
fits.HDUList([fits.PrimaryHDU(), gal, radio, odd]).writeto("fixture_tables.fits", overwrite=True)
# Scaled integers: astropy 5.2 cannot scale back a float array into an I/J column on write, so the
# stored integers are written as they are and the scaling keywords are added to the header
# (through astropy, without touching the data): physical = TZERO + TSCAL * stored.
with fits.open("fixture_tables.fits", mode="update") as h:
    hdr = h["GALAXIES"].header
    hdr.insert("TUNIT5", ("TSCAL5", mu_scale), after=True)
    hdr.insert("TSCAL5", ("TZERO5", mu_zero), after=True)
    hdr.insert("TUNIT6", ("TSCAL6", mag_scale), after=True)
    hdr.insert("TSCAL6", ("TZERO6", mag_zero), after=True)

# Read back with astropy: these are the reference values.
def val(x):
    if isinstance(x, (bytes, np.bytes_)):
        x = x.decode()
    if isinstance(x, str):
        return x
    if isinstance(x, (bool, np.bool_)):
        return bool(x)
    if isinstance(x, (np.integer,)):
        return int(x)
    x = float(x)
    return None if math.isnan(x) else x

out = {"generator": "make_fits_fixtures.py", "astropy": astropy.__version__, "numpy": np.__version__, "hdus": {}}
with fits.open("fixture_tables.fits") as h:
    for ext in ("GALAXIES", "RADIO", "ODD"):
        d = h[ext].data
        hdr = h[ext].header
        cols_out = {}
        for i, c in enumerate(h[ext].columns):
            raw = d.field(c.name)
            values = []
            for r in range(len(d)):
                if c.format[-1:] in ("X", "C") or "P" in c.format:
                    values.append(None)  # not compared: SizeTest lists these types as unsupported
                    continue
                v = raw[r]
                if np.ndim(v) > 0:
                    values.append([val(e) for e in v])
                    continue
                v = val(v)
                if c.null is not None and isinstance(v, int) and v == c.null:
                    v = None
                if isinstance(v, str) and v.strip() == "":
                    v = None
                values.append(v)
            cols_out[c.name] = {"format": c.format, "unit": c.unit, "values": values}
        out["hdus"][ext] = {"index": h.index_of(ext), "rows": len(d), "columns": cols_out}
    out["longstr"] = h["GALAXIES"].header["LONGSTR"]

# Sanity: the scaled columns read back as zero + scale * stored, in float64, as the reader computes them.
for r in range(N):
    assert out["hdus"]["GALAXIES"]["columns"]["mu"]["values"][r] == mu_zero + mu_scale * float(mu_raw[r]), r
    assert out["hdus"]["GALAXIES"]["columns"]["mag"]["values"][r] == mag_zero + mag_scale * float(mag_raw[r]), r

with open("fixture_tables.json", "w") as f:
    json.dump(out, f, indent=1)

# VOTables of the scalar columns, both serialisations (astropy.io.votable).
t = Table()
t["ID"] = MaskedColumn(name, mask=(name == ""))
t["z"] = z
t["theta"] = MaskedColumn(np.nan_to_num(theta, nan=0.0), mask=np.isnan(theta), unit="arcsec")
t["theta_err"] = MaskedColumn(theta_err, unit="arcsec")
t["mu"] = MaskedColumn(mu_zero + mu_scale * mu_raw.astype(np.float64), unit="mag / arcsec2")
t["nobj"] = MaskedColumn(nobj, mask=(nobj == -999))
t["flag"] = flag
for fmt, fn in (("tabledata", "fixture_tabledata.vot"), ("binary2", "fixture_binary2.vot")):
    vt = from_table(t)
    fields = vt.get_first_table().fields
    fields[1].ucd = "src.redshift"
    fields[2].ucd = "phys.angSize;src"
    fields[3].ucd = "stat.error;phys.angSize;src"
    fields[4].ucd = "phot.mag.sb"
    fields[5].values.null = -999   # VALUES null="-999" (astropy needs it for masked integers in BINARY2)
    writeto(vt, fn, tabledata_format=fmt)
print("wrote fixtures with astropy", astropy.__version__)
