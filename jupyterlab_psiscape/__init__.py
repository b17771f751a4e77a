"""psiscape: phase-transition analysis of notebook tables, as a prebuilt JupyterLab extension.

Installing this package places the prebuilt labextension in
``share/jupyter/labextensions/jupyterlab-psiscape``; JupyterLab 4 loads it
without a rebuild. There is no server part.

The version has one source, the npm package's ``package.json``: the wheel's
metadata is read from it at build time, and ``__version__`` from the
project's ``package.json`` in a source tree, or else from the installed
wheel's metadata.
"""

import json
import os
from importlib.metadata import PackageNotFoundError
from importlib.metadata import version as _installed_version


def _read_version():
    here = os.path.dirname(os.path.abspath(__file__))
    # A source tree: the project's package.json, else the built labextension's.
    for candidate in (
        os.path.join(here, os.pardir, "package.json"),
        os.path.join(here, "labextension", "package.json"),
    ):
        try:
            with open(candidate, encoding="utf-8") as fid:
                data = json.load(fid)
        except (OSError, ValueError):
            continue
        if isinstance(data, dict) and data.get("name") == "jupyterlab-psiscape" and isinstance(data.get("version"), str):
            return data["version"]
    # An installed wheel: its metadata (whose version was read from package.json).
    try:
        return _installed_version("jupyterlab_psiscape")
    except PackageNotFoundError:
        return "0+unknown"


__version__ = _read_version()


def _jupyter_labextension_paths():
    return [{"src": "labextension", "dest": "jupyterlab-psiscape"}]
