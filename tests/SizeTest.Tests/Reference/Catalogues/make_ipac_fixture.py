#!/usr/bin/python3
"""Writes an IPAC table fixture for SizeTest's IPAC reader with an independent writer: astropy's
ascii 'ipac' writer (Debian python3-astropy 5.2.1; run with /usr/bin/python3).

    /usr/bin/python3 make_ipac_fixture.py

Outputs (synthetic values, invented for the test):
  fixture_ipac.tbl    keyword and comment lines, the four header lines (names, types, units, nulls),
                      a text id with a blank in it, a masked z (written as the null value), angles in mas,
                      an int column with its own null value
  fixture_ipac.json   the values astropy reads back from fixture_ipac.tbl (null = null), and the library version
"""
import json
import astropy
import numpy as np
from astropy.table import Table, MaskedColumn

t = Table()
t["objname"] = ["G 001", "G002", "G003", "G004", "G005"]
t["z"] = MaskedColumn([0.31, 0.875, 1.2, 2.05, 0.6], mask=[False, False, True, False, False])
t["r_e"] = MaskedColumn([412.5, 210.0, 300.25, 150.0, 95.5], unit="mas")
t["r_e_err"] = MaskedColumn([30.0, 20.0, 20.0, 15.0, 9.0], unit="mas")
t["nobs"] = MaskedColumn(np.array([3, 5, 2, 7, 4], dtype=np.int32), mask=[False, False, False, True, False])
t.meta["comments"] = ["synthetic IPAC fixture for SizeTest"]
t.meta["keywords"] = {"SURVEY": {"value": "invented"}}
t.write("fixture_ipac.tbl", format="ipac", overwrite=True)

back = Table.read("fixture_ipac.tbl", format="ipac")
def values(col):
    m = np.ma.getmaskarray(back[col])
    return [None if m[i] else (back[col][i].item() if hasattr(back[col][i], "item") else str(back[col][i])) for i in range(len(back))]
json.dump({"astropy": astropy.__version__,
           "columns": back.colnames,
           "units": [None if back[c].unit is None else str(back[c].unit) for c in back.colnames],
           "values": {c: values(c) for c in back.colnames}},
          open("fixture_ipac.json", "w"), indent=1)
