#!/usr/bin/env python3
"""Reference values for the skin effect of one isolated round wire.

Printed by scipy.special (a general-purpose library, outside the project),
one line per ratio d/delta:

    d_over_delta  ber(x)  bei(x)  ber'(x)  bei'(x)  Fr_kelvin  Fr_bessel

with x = d / (sqrt(2) * delta). Fr_kelvin is Rac/Rdc from the Kelvin
functions, (x/2)(ber*bei' - bei*ber')/(ber'^2 + bei'^2); Fr_bessel is the
same quantity by a second route, the internal impedance of a round wire
Z/Rdc = (k r / 2) J0(k r) / J1(k r) with k = (1 - j)/delta (complex Bessel
functions), so the two columns check each other.

Exits non-zero if scipy is missing: the Rust test must then fail.
"""
import sys

try:
    import numpy as np
    from scipy import special
except Exception as e:  # noqa: BLE001
    print(f"scipy not available: {e}", file=sys.stderr)
    sys.exit(2)

ratios = np.geomspace(0.1, 10.0, 41)
for a in ratios:
    x = a / np.sqrt(2.0)
    ber, bei = special.ber(x), special.bei(x)
    berp, beip = special.berp(x), special.beip(x)
    fr_k = (x / 2.0) * (ber * beip - bei * berp) / (berp**2 + beip**2)
    # Bessel route, delta = 1, r = a/2.
    kr = (1 - 1j) * (a / 2.0)
    fr_b = ((kr / 2.0) * special.jv(0, kr) / special.jv(1, kr)).real
    print(f"{a:.17g} {ber:.17g} {bei:.17g} {berp:.17g} {beip:.17g} {fr_k:.17g} {fr_b:.17g}")
