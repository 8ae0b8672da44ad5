"""Reference exponential sweep from scipy.signal.chirp, for the sweep tests.

stdin: JSON {"f1Hz", "f2Hz", "durationS", "sampleRate"}
stdout: JSON {"samples": [...]}: chirp(t, f0=f1, t1=T, f1=f2, method='logarithmic', phi=-90)
at t = n / fs for n < round(T * fs), i.e. sin of the Farina phase, no fades.
"""
import json
import sys

import numpy as np
from scipy import signal

request = json.load(sys.stdin)
fs = request["sampleRate"]
duration = request["durationS"]
t = np.arange(int(round(duration * fs))) / fs
x = signal.chirp(t, f0=request["f1Hz"], t1=duration, f1=request["f2Hz"], method="logarithmic", phi=-90)
json.dump({"samples": x.tolist()}, sys.stdout)
