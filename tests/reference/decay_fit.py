"""Least-squares line through given points with scipy.stats.linregress, for the decay-fit tests.

stdin: JSON {"times": [...], "values": [...]}
stdout: JSON {"slope", "intercept", "r"}
"""
import json
import sys

from scipy import stats

request = json.load(sys.stdin)
fit = stats.linregress(request["times"], request["values"])
json.dump({"slope": fit.slope, "intercept": fit.intercept, "r": fit.rvalue}, sys.stdout)
