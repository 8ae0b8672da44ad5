"""Reference zero-phase filtering with the end extended by its even mirror image, for the band-filter tests.

The signal is followed by scipy's even extension of its end (scipy.signal._arraytools.even_ext, the
padding sosfiltfilt uses: x[-2], x[-3], ...), then filtered forward and backward with sosfilt from
a zero state, and cut back to its length. The start is not extended.

stdin: JSON {"x": [...], "sos": [[b0, b1, b2, a0, a1, a2], ...], "pad": n, "leadingZeros": m}
stdout: JSON {"y": [...]}  (m zeros, then the signal: m + len(x) values)
"""
import json
import sys

import numpy as np
from scipy import signal
from scipy.signal._arraytools import even_ext

request = json.load(sys.stdin)
x = np.asarray(request["x"], dtype=float)
pad = int(request["pad"])
sos = np.asarray(request["sos"], dtype=float)
extended = even_ext(x, pad)[pad:] if pad > 0 else x
work = np.concatenate([np.zeros(int(request.get("leadingZeros", 0))), extended])
forward = signal.sosfilt(sos, work)
both = signal.sosfilt(sos, forward[::-1])[::-1]
json.dump({"y": both[: len(work) - pad].tolist()}, sys.stdout)
