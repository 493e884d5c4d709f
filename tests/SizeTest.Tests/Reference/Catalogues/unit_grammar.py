"""Independent check of the unit spellings in UnitGrammarTests: astropy.units parses each with the FITS
(FITS Standard 4.0 §4.3) or VOUnit parser, or its generic one, and compares with mag / arcsec**2.
Run with /usr/bin/python3 (Debian python3-astropy)."""
import astropy
import astropy.units as u

target = u.mag / u.arcsec**2
spellings = ["mag/arcsec2", "mag.arcsec-2", "arcsec-2 mag", "mag/arcsec**2", "mag arcsec^-2", "mag arcsec**-2",
             "mag arcsec**(-2)", "mag*arcsec^(-2)", "arcsec-2.mag", "mag/(arcsec2)", "mag/(arcsec.arcsec)", "mag/arcsec/arcsec"]
print(f"# astropy {astropy.__version__}")
for s in spellings:
    results = []
    for fmt in ("fits", "vounit", "generic"):
        try:
            results.append(f"{fmt}={u.Unit(s, format=fmt) == target}")
        except Exception as e:  # noqa: BLE001 - report which parser refuses the spelling
            results.append(f"{fmt}=refused")
    print(f"{s!r}: {' '.join(results)}")
for s, factor in [("arcsec", "pi/648000"), ("mas", "pi/648000e3"), ("arcmin", "pi/10800"), ("deg", "pi/180"), ("rad", "1")]:
    print(f"{s}: {u.Unit(s, format='fits').to(u.rad)!r} rad (expected {factor})")
