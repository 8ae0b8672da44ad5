"""Linear convolution with scipy.signal.fftconvolve, to make "recorded" sweeps for the deconvolution tests.

stdin: JSON {"signal": [...], "impulseResponse": [...]}
stdout: JSON {"convolved": [...]} (full length, len(signal) + len(impulseResponse) - 1)
"""
import json
import sys

import numpy as np
from scipy import signal

request = json.load(sys.stdin)
y = signal.fftconvolve(np.asarray(request["signal"]), np.asarray(request["impulseResponse"]), mode="full")
json.dump({"convolved": y.tolist()}, sys.stdout)
