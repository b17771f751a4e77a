"""A JupyterLab server side (jupyterlab_server.LabServerApp) that finds prebuilt
extensions the way JupyterLab does, for the installed-wheel test.

Run it with the Python of the environment under test::

    VENV/bin/python test/package/lab_server.py PORT WORKDIR

The labextensions path is left at its default (``jupyter_path("labextensions")``
of that interpreter), so an extension installed into the environment's
``share/jupyter/labextensions`` is found exactly as a user's JupyterLab finds
it. ``GET /lab`` answers with the page configuration JSON alone (the real page
embeds the same object), so the caller can read ``federated_extensions`` and
``disabledExtensions``. User configuration, data and runtime folders are moved
into WORKDIR so that nothing of the machine's user changes the answer.
"""

import json
import os
import sys

PORT = int(sys.argv[1])
WORK = os.path.abspath(sys.argv[2])

DIRS = {name: os.path.join(WORK, name) for name in ("root", "templates", "static", "schemas", "settings", "workspaces", "app", "config", "data", "runtime")}
for _path in DIRS.values():
    os.makedirs(_path, exist_ok=True)
os.environ["JUPYTER_CONFIG_DIR"] = DIRS["config"]
os.environ["JUPYTER_DATA_DIR"] = DIRS["data"]
os.environ["JUPYTER_RUNTIME_DIR"] = DIRS["runtime"]
os.environ["JUPYTER_PLATFORM_DIRS"] = "0"
with open(os.path.join(DIRS["templates"], "index.html"), "w", encoding="utf-8") as fid:
    fid.write("{{ page_config | tojson }}")

from jupyter_core.paths import jupyter_path  # noqa: E402
from jupyterlab_server import LabServerApp  # noqa: E402
from traitlets import default  # noqa: E402


class ProbeLab(LabServerApp):
    name = "lab"
    app_name = "psiscape package test"
    extension_url = "/lab"
    default_url = "/lab"
    load_other_extensions = False

    @default("templates_dir")
    def _default_templates_dir(self):
        return DIRS["templates"]

    @default("static_dir")
    def _default_static_dir(self):
        return DIRS["static"]

    @default("schemas_dir")
    def _default_schemas_dir(self):
        return DIRS["schemas"]

    @default("app_settings_dir")
    def _default_app_settings_dir(self):
        return DIRS["app"]

    @default("user_settings_dir")
    def _default_user_settings_dir(self):
        return DIRS["settings"]

    @default("workspaces_dir")
    def _default_workspaces_dir(self):
        return DIRS["workspaces"]


def _jupyter_server_extension_points():
    return [{"module": __name__, "app": ProbeLab}]


if __name__ == "__main__":
    # What the caller needs besides HTTP: where this interpreter looks for extensions.
    print(json.dumps({"prefix": sys.prefix, "labextensions_path": jupyter_path("labextensions")}), flush=True)
    ProbeLab.launch_instance(
        [
            "--ServerApp.ip=127.0.0.1",
            f"--ServerApp.port={PORT}",
            "--ServerApp.port_retries=0",
            "--ServerApp.open_browser=False",
            "--ServerApp.token=",
            "--ServerApp.password=",
            "--ServerApp.allow_root=True",
            f"--ServerApp.root_dir={DIRS['root']}",
            "--ServerApp.log_level=WARN",
        ]
    )
