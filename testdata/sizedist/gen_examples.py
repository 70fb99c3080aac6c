#!/usr/bin/python3
"""Writes raw_drops_um.csv: 3000 invented drop diameters (µm) drawn from a
number-basis log-normal (CMD 30 µm, σg 1.6), kept between 2 and 400 µm.

Regenerate with:  /usr/bin/python3 testdata/sizedist/gen_examples.py
Standard library only; random.Random(20240611) makes the file reproducible.
"""
import math
import os
import random

HERE = os.path.dirname(os.path.abspath(__file__))


def main():
    rng = random.Random(20240611)
    drops = []
    # Number-basis log-normal drops, CMD 30 µm, σg 1.6 (invented).
    while len(drops) < 3000:
        d = rng.lognormvariate(math.log(30.0), math.log(1.6))
        if 2.0 < d < 400.0:
            drops.append(d)
    with open(os.path.join(HERE, "raw_drops_um.csv"), "w") as fh:
        fh.write("Drop diameter (micron)\n")
        for d in drops:
            fh.write("%.2f\n" % d)


if __name__ == "__main__":
    main()
