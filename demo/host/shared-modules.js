// The module-federation `shared` map of both lab flavours: every JupyterLab
// core package that is installed, singletons as @jupyterlab/core-meta lists.
const core = require('@jupyterlab/core-meta/core.package.json');

function resolvable(name) {
  try {
    require.resolve(`${name}/package.json`);
    return true;
  } catch {
    return false;
  }
}

/** `shared` for ModuleFederationPlugin. */
function sharedModules() {
  const shared = {};
  for (const [name, range] of Object.entries({ ...core.resolutions, ...core.dependencies })) {
    if (!resolvable(name)) {
      continue;
    }
    // Require what is installed (same minor line), not core-meta's patch pins:
    // extension packages on the registry can trail the libraries by a patch.
    const version = require(`${name}/package.json`).version;
    const [major, minor] = version.split('.');
    shared[name] = { requiredVersion: /^[~^]/.test(range) ? `^${major}.${minor}.0` : false, version };
  }
  for (const name of core.jupyterlab.singletonPackages) {
    if (shared[name]) {
      shared[name].singleton = true;
    }
  }
  return shared;
}

module.exports = { sharedModules };
