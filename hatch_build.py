"""Build hook: make sure the prebuilt labextension exists before packaging.

The wheel carries ``jupyterlab_psiscape/labextension`` (built by ``npm run
build``) as shared data. When that folder's ``package.json`` is missing — a
fresh clone installed with ``pip install .`` — this hook runs ``npm run build``
if npm and the project's npm packages (``node_modules``) are there; otherwise
it stops with a message saying what to run. Written against the build hook
interface of hatchling 1.12 (Debian 12), which later versions keep.
"""

import json
import os
import shutil
import subprocess
import sys

from hatchling.builders.hooks.plugin.interface import BuildHookInterface

BUILD_COMMAND = "npm ci && npm run build"


def _output_dir(root):
    with open(os.path.join(root, "package.json"), encoding="utf-8") as fid:
        return json.load(fid)["jupyterlab"]["outputDir"]


class LabextensionBuildHook(BuildHookInterface):
    PLUGIN_NAME = "custom"

    def initialize(self, version, build_data):
        root = self.root
        built = os.path.join(root, _output_dir(root), "package.json")
        if os.path.isfile(built):
            return
        relative = os.path.relpath(built, root)
        npm = shutil.which("npm")
        if npm is None:
            self._stop(
                f"The JupyterLab extension is not built ({relative} is missing) and npm was not found.\n"
                f"Install Node.js 20 with npm, run `{BUILD_COMMAND}` in {root}, then install again."
            )
        if not os.path.isdir(os.path.join(root, "node_modules")):
            self._stop(
                f"The JupyterLab extension is not built ({relative} is missing) and its npm packages are not installed.\n"
                f"Run `{BUILD_COMMAND}` in {root}, then install again."
            )
        print(f"[psiscape] {relative} is missing: running npm run build", file=sys.stderr, flush=True)
        # npm's own output goes to the builder's log (pip shows it with -v or on failure).
        result = subprocess.run([npm, "run", "build"], cwd=root, stdout=sys.stderr, stderr=sys.stderr, check=False)
        if result.returncode != 0 or not os.path.isfile(built):
            self._stop(
                f"Building the JupyterLab extension with `npm run build` failed (see its output above).\n"
                f"Run `{BUILD_COMMAND}` in {root} to see the error, then install again."
            )

    def _stop(self, message):
        # A plain message and a non-zero exit, without a Python traceback.
        print(f"\n[psiscape] {message}\n", file=sys.stderr, flush=True)
        sys.exit(1)
