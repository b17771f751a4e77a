#!/usr/bin/python3
"""Generate the demo and fixture notebooks by executing them with real pandas.

The scenario is invented: "AM-17" is a fictitious layered ferromagnet measured by
a fictitious group (the Aldmoor cryogenics lab). Numbers come from a seeded
mean-field curve plus noise; they illustrate the tool and are not measurements.

Run with Debian's interpreter (python3-pandas, python3-nbclient, python3-ipykernel):
    /usr/bin/python3 demo/generate_notebooks.py
The executed notebooks are committed, so the demo needs no Python at run time.
"""
import os
import sys

import nbformat
from nbclient import NotebookClient

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
DEMO_DIR = os.path.join(HERE, "notebooks")
FIXTURE_DIR = os.path.join(ROOT, "test", "fixtures")

SETUP = """\
import numpy as np
import pandas as pd
pd.set_option("display.max_rows", 500)

def weiss_half(tau):
    \"\"\"Reduced spin-1/2 mean-field magnetisation m(T/Tc) by fixed-point iteration.\"\"\"
    m = np.ones_like(tau)
    for _ in range(4000):
        m = np.tanh(m / tau)
    return np.where(tau < 1, m, 0.0)
"""

DEMO_CELLS = [
    ("markdown", """\
# AM-17: magnetisation of a layered ferromagnet (demo)

*Invented scenario for the psiscape demo.* The Aldmoor cryogenics lab measured the
magnetisation of the fictitious compound **AM-17** on warming in a small field.
The numbers below come from a seeded mean-field curve plus noise; they are not real data.

Right-click the table output below and choose **Analyse This Table with psiscape**,
or select the cell and run *Analyse Table in Selected Cell* from the command palette.
In the panel, pick a model under **Fit** (try *Weiss mean field*) and press **Fit**;
the analysis is saved in the notebook when you save it.
To see what Landau coefficients imply, open **View → Open Landau Free-Energy Explorer**."""),
    ("code", SETUP),
    ("code", """\
rng = np.random.default_rng(1717)
T = np.linspace(20.0, 340.0, 81)
Tc, Ms = 287.4, 92.3
M = Ms * weiss_half(T / Tc) + rng.normal(0.0, 0.4, T.size)
mt = pd.DataFrame({"T (K)": T, "M (emu/g)": M.round(4), "sigma_M (emu/g)": 0.4})
mt.to_csv("am17_MT.csv", index=False)
mt"""),
    ("markdown", """\
A second run with the option `display.html.table_schema` on: the same kind of table is
also published as `application/vnd.dataresource+json`, which keeps full precision."""),
    ("code", """\
pd.set_option("display.html.table_schema", True)
rng = np.random.default_rng(2024)
T2 = np.linspace(150.0, 300.0, 41)
I = 5200.0 * weiss_half(T2 / 287.4) ** 2 + 40.0 + rng.normal(0.0, 25.0, T2.size)
bragg = pd.DataFrame({"T (K)": T2, "I (counts/monitor)": I, "sigma_I": np.sqrt(np.abs(I))})
bragg"""),
    ("code", """\
pd.set_option("display.html.table_schema", False)
print("Sample AM-17, mass 12.4 mg, measured on warming at 0.05 T")"""),
    ("markdown", """\
Field sweeps: M(H) isotherms every 0.8 K from 281.4 K to 293.4 K, in long format
(one row per point; the temperature reads a little off its setpoint, as real thermometers do).
Right-click the table and choose **Analyse Isotherms in This Table** (or run *Analyse Isotherms in Selected Cell* from the command palette)."""),
    ("code", """\
rng = np.random.default_rng(42)
rows = []
for T_set in np.arange(281.4, 293.5, 0.8):
    tau = T_set / Tc
    ms = weiss_half(np.array([tau]))[0]
    m = ms + np.linspace(0.005, 0.2, 30)            # magnetisation grid above the spontaneous value
    h = tau * np.arctanh(m) - m                     # exact spin-1/2 mean-field isotherm
    keep = h > 0
    T_read = T_set + rng.normal(0.0, 0.02, keep.sum())
    rows.append(pd.DataFrame({"T (K)": T_read, "H (Oe)": 2.0e4 * h[keep], "M (emu/g)": Ms * m[keep]}))
iso = pd.concat(rows, ignore_index=True)
iso.to_csv("am17_MH.csv", index=False)
pd.set_option("display.max_rows", 2000)
iso"""),
]

FIXTURE_CELLS = [
    ("code", SETUP),
    ("code", """\
small = pd.DataFrame({"T (K)": [10.0, 20.0, 30.0], "M [emu/g]": [1.25, 1.5, -0.75], "flag": [True, False, True]})
small"""),
    ("code", """\
pd.set_option("display.html.table_schema", True)
schema_df = pd.DataFrame({"T_K": [100.5, 200.25, 300.125], "chi": [0.001, 0.002, 0.004]})
schema_df"""),
    ("code", """\
pd.set_option("display.html.table_schema", False)
print("no table here")"""),
    ("code", """\
pd.set_option("display.max_rows", 10)
long_df = pd.DataFrame({"T (K)": np.arange(40.0), "M": np.arange(40.0) ** 2})
long_df"""),
]


def build(cells, path, cwd):
    nb = nbformat.v4.new_notebook()
    nb.metadata["kernelspec"] = {"name": "python3", "display_name": "Python 3", "language": "python"}
    nb.metadata["language_info"] = {"name": "python"}
    for i, (kind, source) in enumerate(cells):
        if kind == "markdown":
            cell = nbformat.v4.new_markdown_cell(source)
        else:
            cell = nbformat.v4.new_code_cell(source)
        cell["id"] = f"cell-{i + 1}"  # stable ids: regenerating gives the same notebook
        nb.cells.append(cell)
    NotebookClient(nb, kernel_name="python3", timeout=120, resources={"metadata": {"path": cwd}}).execute()
    for cell in nb.cells:
        cell.get("metadata", {}).pop("execution", None)
    nbformat.write(nb, path)
    print(f"wrote {os.path.relpath(path, ROOT)}")


def main():
    os.makedirs(DEMO_DIR, exist_ok=True)
    os.makedirs(FIXTURE_DIR, exist_ok=True)
    build(DEMO_CELLS, os.path.join(DEMO_DIR, "am17-demo.ipynb"), DEMO_DIR)
    build(FIXTURE_CELLS, os.path.join(FIXTURE_DIR, "outputs.ipynb"), FIXTURE_DIR)
    return 0


if __name__ == "__main__":
    sys.exit(main())
