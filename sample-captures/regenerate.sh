#!/usr/bin/env bash
# Rebuilds every demo capture in this folder from the designs in ../designs with fixed seeds.
# The captures are invented demo data of the Quillhaven scenario (docs/circuits.md, "Demo captures").
set -euo pipefail
cd "$(dirname "$0")/.."
dotnet build src/Cli -v quiet -nologo >/dev/null
run() { dotnet src/Cli/bin/Debug/net10.0/patchproof.dll design simulate "$@" || [ $? -eq 3 ]; }

# QH-L3 Wren: healthy Lorenz board, all parts within tolerance, three channels.
run designs/qh-l3-wren.json --part-spread 0.5 --seed 11 --t-end 40ms --style comma \
  --out sample-captures/qh-l3-wren.csv
# QH-L4 Plover: the resistor feeding x into the y integrator (R3) reads about 10 % high.
run designs/qh-l4-plover.json --faults R3=+10% --part-spread 0.5 --seed 12 --t-end 40ms --style semicolon \
  --out sample-captures/qh-l4-plover.csv
# QH-L5 Tern: the z integrator's capacitor (C3, a 20 % part) came in 15 % low; only x and z captured.
run designs/qh-l5-tern.json --faults C3=-15% --part-spread 0.5 --seed 13 --t-end 40ms --channels CH1=x,CH2=z \
  --style semicolon-decimal-comma --out sample-captures/qh-l5-tern.csv
# QH-R1 Gannet: Rössler board whose multiplier scale factor runs 4 % low, recorded with probes that are off by up to
# 1.5 %; the second file is the bench's probe calibration: all three probes on the x integrator's output.
gannet_probes="CH1=+1.2%,CH2=-0.6%,CH3=-1.5%"
run designs/qh-r1-gannet.json --faults M1=-4% --part-spread 0.5 --seed 48 --t-end 120ms --style units-row \
  --probe-gains "$gannet_probes" --out sample-captures/qh-r1-gannet.csv
run designs/qh-r1-gannet.json --faults M1=-4% --part-spread 0.5 --seed 24 --t-end 20ms --style units-row \
  --channels CH1=x,CH2=x,CH3=x --probe-gains "$gannet_probes" --out sample-captures/qh-r1-gannet-probe-calibration.csv
# The same probes on the bench's reference square wave: 10 V peak-to-peak from -4 V to +6 V, 1 kHz, stated to 0.1 %
# (calibrate --known-amplitude 10V --amplitude-accuracy 0.1%), for an absolute calibration.
run designs/qh-r1-gannet.json --seed 34 --t-end 20ms --style units-row --channels CH1=x,CH2=y,CH3=z \
  --window CH1=16V@0.5V,CH2=16V@0.5V,CH3=16V@0.5V --probe-gains "$gannet_probes" \
  --square-wave 10V@-4V --square-period 1ms --edge-time 2us --out sample-captures/qh-r1-gannet-square-wave-probe-calibration.csv
# QH-D2 Dunlin: healthy damped oscillator, two channels, recorded from the initial kick.
run designs/qh-d2-dunlin.json --part-spread 0.5 --seed 15 --settle 0s --trigger 0.05 --t-end 30ms --samples 20000 \
  --style tab --out sample-captures/qh-d2-dunlin.csv
# QH-L9 Skua: slow Lorenz (470 nF); the scope window on z is too tight, so z clips.
run designs/qh-l9-skua.json --part-spread 0.5 --seed 16 --t-end 1.9s --settle 1.4s --window CH3=8V@3V --style comma \
  --out sample-captures/qh-l9-skua.csv
