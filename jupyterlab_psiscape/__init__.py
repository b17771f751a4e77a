"""psiscape: phase-transition analysis of notebook tables, as a prebuilt JupyterLab extension.

Installing this package places the prebuilt labextension in
``share/jupyter/labextensions/jupyterlab-psiscape``; JupyterLab 4 loads it
without a rebuild. There is no server part.
"""

__version__ = "0.1.0"


def _jupyter_labextension_paths():
    return [{"src": "labextension", "dest": "jupyterlab-psiscape"}]
