#!/usr/bin/python3
"""Serve the server-flavoured psiscape lab with a real Jupyter server.

A small ``jupyterlab_server.LabServerApp`` serving psiscape's one lab frontend
(``demo/build``, built by ``demo/build.mjs``; the same bundle as the kernel-free
demo, which starts its server flavour here because this page configuration
has no ``labFlavour``), with the prebuilt psiscape
labextension as a federated extension, real contents, kernels (ipykernel),
sessions, settings and workspaces. Everything the server writes goes to a
temporary folder that is removed on exit; the notebooks are copies.

Run with Debian's Python, which sees the Debian packages
(python3-jupyter-server, python3-jupyterlab-server, python3-ipykernel)::

    node demo/build.mjs
    /usr/bin/python3 demo/server/serve.py --port 8901 [--notebook FILE ...]

Then open http://127.0.0.1:8901/lab/tree/<notebook name>. Loopback only,
no token, no password: for local tests and demos, never a shared machine.
"""

import argparse
import atexit
import json
import os
import shutil
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.abspath(os.path.join(HERE, "..", ".."))
EXTENSION_NAME = "jupyterlab-psiscape"

# Filled by main() before the server starts; read by the app's trait defaults.
OPTIONS = {}


def parse_args(argv):
    parser = argparse.ArgumentParser(description="Serve the psiscape lab with a real Jupyter server and kernel.")
    parser.add_argument("--port", type=int, default=8901, help="port on 127.0.0.1 (default 8901)")
    parser.add_argument(
        "--notebook",
        action="append",
        default=[],
        help="file copied into the server's root folder (repeatable; default: every file of demo/notebooks)",
    )
    parser.add_argument("--build-dir", default=os.path.join(ROOT, "demo", "build"), help="the built frontend (demo/build)")
    parser.add_argument(
        "--labextension",
        default=os.path.join(ROOT, "jupyterlab_psiscape", "labextension"),
        help="the built psiscape labextension folder",
    )
    parser.add_argument(
        "--without-psiscape",
        action="store_true",
        help="serve the lab without the psiscape labextension (what a collaborator without psiscape sees)",
    )
    parser.add_argument("--keep", action="store_true", help="keep the temporary folder on exit (for debugging)")
    parser.add_argument("--log-level", default="WARN", help="Jupyter server log level (default WARN)")
    return parser.parse_args(argv)


def check_inputs(args):
    """Say precisely what is missing instead of serving a broken page."""
    problems = []
    template = os.path.join(args.build_dir, "templates", "index.html")
    if not os.path.isfile(template):
        problems.append(f"the frontend is not built ({template} is missing): run `node demo/build.mjs`")
    built = os.path.join(args.labextension, "package.json")
    if args.without_psiscape:
        pass
    elif not os.path.isfile(built):
        problems.append(f"the labextension is not built ({built} is missing): run `npm run build`")
    else:
        with open(built, encoding="utf-8") as fid:
            if "_build" not in json.load(fid).get("jupyterlab", {}):
                problems.append(f"{built} has no jupyterlab._build entry: run `npm run build`")
    if not 0 < args.port < 65536:
        problems.append(f"invalid port: {args.port}")
    for nb in args.notebook:
        if not os.path.isfile(nb):
            problems.append(f"no such notebook: {nb}")
    if problems:
        for p in problems:
            print(f"serve.py: {p}", file=sys.stderr)
        sys.exit(2)


def prepare_tree(args):
    """Temporary root, labextensions, settings and workspaces folders."""
    tmp = tempfile.mkdtemp(prefix="psiscape-server-")
    if not args.keep:
        atexit.register(shutil.rmtree, tmp, True)
    dirs = {name: os.path.join(tmp, name) for name in ("root", "labextensions", "settings", "workspaces", "app", "jupyter")}
    for d in dirs.values():
        os.makedirs(d)
    sources = args.notebook or [
        os.path.join(ROOT, "demo", "notebooks", f) for f in sorted(os.listdir(os.path.join(ROOT, "demo", "notebooks")))
    ]
    for src in sources:
        if os.path.isfile(src):
            shutil.copy(src, dirs["root"])
    if not args.without_psiscape:
        shutil.copytree(args.labextension, os.path.join(dirs["labextensions"], EXTENSION_NAME))
    # Keep user-level Jupyter configuration, data and runtime files out of the way.
    for var, sub in (("JUPYTER_CONFIG_DIR", "config"), ("JUPYTER_DATA_DIR", "data"), ("JUPYTER_RUNTIME_DIR", "runtime"), ("IPYTHONDIR", "ipython")):
        path = os.path.join(dirs["jupyter"], sub)
        os.makedirs(path)
        os.environ[var] = path
    os.environ["JUPYTER_PLATFORM_DIRS"] = "0"
    # ipykernel's debugger warning about frozen modules is noise here.
    os.environ.setdefault("PYDEVD_DISABLE_FILE_VALIDATION", "1")
    return tmp, dirs


def app_version():
    pkg = os.path.join(ROOT, "node_modules", "@jupyterlab", "application", "package.json")
    try:
        with open(pkg, encoding="utf-8") as fid:
            return json.load(fid)["version"]
    except (OSError, ValueError, KeyError):
        return ""


def make_app_class():
    # Imported here so that --help and input checks work without the packages.
    from jupyterlab_server import LabServerApp
    from traitlets import default

    class PsiscapeLab(LabServerApp):
        """JupyterLab's server side, serving the psiscape frontend build."""

        # Named "lab": static files at /static/lab/, the page at /lab.
        name = "lab"
        app_name = "psiscape lab"
        extension_url = "/lab"
        default_url = "/lab"
        load_other_extensions = False

        @default("app_version")
        def _default_app_version(self):
            return OPTIONS["app_version"]

        @default("static_dir")
        def _default_static_dir(self):
            return os.path.join(OPTIONS["build_dir"], "static")

        @default("templates_dir")
        def _default_templates_dir(self):
            return os.path.join(OPTIONS["build_dir"], "templates")

        @default("schemas_dir")
        def _default_schemas_dir(self):
            return os.path.join(OPTIONS["build_dir"], "schemas")

        @default("themes_dir")
        def _default_themes_dir(self):
            return os.path.join(OPTIONS["build_dir"], "themes")

        @default("app_settings_dir")
        def _default_app_settings_dir(self):
            return OPTIONS["dirs"]["app"]

        @default("user_settings_dir")
        def _default_user_settings_dir(self):
            return OPTIONS["dirs"]["settings"]

        @default("workspaces_dir")
        def _default_workspaces_dir(self):
            return OPTIONS["dirs"]["workspaces"]

        @default("labextensions_path")
        def _default_labextensions_path(self):
            # Only ours: system-wide prebuilt extensions are not part of this lab.
            return [OPTIONS["dirs"]["labextensions"]]

        def initialize_handlers(self):
            super().initialize_handlers()
            self.handlers.extend(newer_server_handlers())

    return PsiscapeLab


def newer_server_handlers():
    """Answers to two requests JupyterLab 4 makes that Jupyter Server 1.x lacks.

    ``GET /api/me`` (the current user: an anonymous local user here) and the
    ``/api/events/subscribe`` websocket (accepted; this server emits no
    events). Without them both answer 404, which is harmless but keeps the
    frontend retrying and fills the browser console.
    """
    from jupyter_server.base.handlers import APIHandler
    from tornado import web
    from tornado.websocket import WebSocketHandler

    class MeHandler(APIHandler):
        @web.authenticated
        def get(self):
            identity = {
                "username": "local",
                "name": "Local user",
                "display_name": "Local user",
                "initials": "LU",
                "avatar_url": None,
                "color": None,
            }
            self.finish(json.dumps({"identity": identity, "permissions": {}}))

    class EventsHandler(WebSocketHandler):
        def open(self, *args, **kwargs):
            pass

        def on_message(self, message):
            pass

    return [(r"/api/me", MeHandler), (r"/api/events/subscribe", EventsHandler)]


def _jupyter_server_extension_points():
    """Entry point the Jupyter server looks up in this module."""
    return [{"module": __name__, "app": OPTIONS["app_class"]}]


def main(argv=None):
    args = parse_args(sys.argv[1:] if argv is None else argv)
    check_inputs(args)
    tmp, dirs = prepare_tree(args)
    OPTIONS.update(build_dir=os.path.abspath(args.build_dir), dirs=dirs, app_version=app_version())
    app_class = make_app_class()
    OPTIONS["app_class"] = app_class
    print(f"[serve.py] root folder {dirs['root']}; http://127.0.0.1:{args.port}/lab", flush=True)
    app_class.launch_instance(
        [
            "--ServerApp.ip=127.0.0.1",
            f"--ServerApp.port={args.port}",
            "--ServerApp.port_retries=0",
            "--ServerApp.open_browser=False",
            "--ServerApp.token=",
            "--ServerApp.password=",
            "--ServerApp.allow_root=True",
            f"--ServerApp.root_dir={dirs['root']}",
            f"--ServerApp.log_level={args.log_level}",
        ]
    )


if __name__ == "__main__":
    main()
