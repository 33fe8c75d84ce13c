"""fixturejson: the JSON layout of the scipy fixtures (fit_scipy.py, plan_scipy.py).

Lists of numbers stand on one line, everything else one entry per line; floats are written as
repr, so that the committed values read back exactly.
"""

import json


def dumps(v, indent=0):
    """JSON with lists of numbers on one line; floats as repr (round-trip exact)."""
    pad = " " * indent
    if isinstance(v, dict):
        items = ['%s "%s": %s' % (pad, k, dumps(x, indent + 1)) for k, x in v.items()]
        return "{\n" + ",\n".join(items) + "\n" + pad + "}"
    if isinstance(v, (list, tuple)):
        if all(not isinstance(x, (dict, list, tuple)) for x in v):
            return "[" + ", ".join(dumps(x) for x in v) + "]"
        return "[\n" + ",\n".join(pad + " " + dumps(x, indent + 1) for x in v) + "\n" + pad + "]"
    return json.dumps(v)
