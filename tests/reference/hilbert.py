"""Reference analytic signal for tests/unit/analysis/envelope.test.ts.

Reads {"x": [...], "n": fftSize} as JSON on stdin and writes {"re": [...], "im": [...]}:
scipy.signal.hilbert(x, N=n)[:len(x)], the FFT method of Marple (IEEE Trans. SP 47(9), 1999).
"""
import json
import sys

import numpy as np
from scipy.signal import hilbert

request = json.load(sys.stdin)
x = np.asarray(request["x"], dtype=float)
analytic = hilbert(x, N=int(request["n"]))[: len(x)]
json.dump({"re": analytic.real.tolist(), "im": analytic.imag.tolist()}, sys.stdout)
