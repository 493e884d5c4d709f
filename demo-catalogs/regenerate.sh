#!/bin/sh
# Re-draws the synthetic demo catalogues with the exact commands in their READMEs.
# Run from the repository root after `dotnet build SizeTest.sln`.
set -e
cd "$(dirname "$0")"
S="dotnet ../src/SizeTest.Cli/bin/Debug/net10.0/sizetest.dll"
$S simulate --model lcdm --n 4000 --z-dist survey:0.9:0.05:3.5 --r0-kpc 4.5 --size-evolution -1.1 --scatter-dex 0.2 --mu0 20.8 --sb-evolution 1.0 --scatter-mag 0.3 --sb-limit 24.5 --min-size 0.08 --size-err-frac 0.05 --size-err-floor 0.02 --mu-err 0.1 --seed 20261201 --out qdf-optical/qdf_optical_galaxies.csv --force
$S simulate --model lcdm --kind radio --n 300 --z-dist uniform:0.5:3.5 --lm-pc 11.03 --lum-exponent 0 --size-evolution 0 --scatter-dex 0.12 --size-err-frac 0.1 --seed 20261202 --out qlba-radio/qlba_compact_sources.fits --force
$S simulate --model tired-light --n 1000 --z-dist survey:0.9:0.05:3.5 --r0-kpc 4.5 --size-evolution 0 --scatter-dex 0.2 --mu0 20.8 --sb-evolution 0 --scatter-mag 0.3 --sb-limit 24.5 --min-size 0.08 --size-err-frac 0.05 --size-err-floor 0.02 --mu-err 0.1 --seed 20261203 --out qdf-optical-static/qdf_static_comparison.vot --force
