// Starts a JupyterLab application from the packages bundled in the lab
// frontend plus every prebuilt (federated) extension the page configuration
// lists. demo/host/main.js calls it with the plugins of one flavour.
import { PageConfig } from '@jupyterlab/coreutils';
import { JupyterLab } from '@jupyterlab/application';
import { IServiceManager } from '@jupyterlab/services';
import { PluginRegistry } from '@lumino/coreutils';

function pluginsOf(moduleExports) {
  const exported = moduleExports && moduleExports.__esModule ? moduleExports.default : moduleExports;
  return Array.isArray(exported) ? exported : [exported];
}

async function federatedModule(scope, module) {
  const factory = await window._JUPYTERLAB[scope].get(module);
  return factory();
}

/**
 * @param {{ lab: [string, object][], mime: [string, object][], lite?: [string, object][], disabledPlugins: string[] }} packages
 *   bundled packages; `lite` plugins replace the JupyterLab plugins providing the same services
 * @param {string} name application name
 * @returns {Promise<JupyterLab>} the started application
 */
export async function startLab(packages, name) {
  const isDisabled = id => packages.disabledPlugins.includes(id) || PageConfig.Extension.isDisabled(id);
  const lite = (packages.lite ?? []).flatMap(([, mod]) => pluginsOf(mod));
  const liteTokens = new Set(lite.filter(p => p.provides).map(p => p.provides.name));
  const lab = packages.lab.flatMap(([, mod]) => pluginsOf(mod)).filter(p => !(p.provides && liteTokens.has(p.provides.name)));
  const plugins = [...lab, ...lite];
  const mimeExtensions = packages.mime.flatMap(([, mod]) => pluginsOf(mod));

  const federated = JSON.parse(PageConfig.getOption('federated_extensions') || '[]');
  for (const data of federated) {
    try {
      if (data.extension) {
        plugins.push(...pluginsOf(await federatedModule(data.name, data.extension)));
      }
      if (data.mimeExtension) {
        mimeExtensions.push(...pluginsOf(await federatedModule(data.name, data.mimeExtension)));
      }
      if (data.style) {
        await federatedModule(data.name, data.style);
      }
    } catch (reason) {
      console.error(`extension ${data.name} failed to load`, reason);
    }
  }

  const pluginRegistry = new PluginRegistry();
  pluginRegistry.registerPlugins(plugins.filter(p => !isDisabled(p.id)));
  const serviceManager = await pluginRegistry.resolveRequiredService(IServiceManager);
  const app = new JupyterLab({ pluginRegistry, serviceManager, mimeExtensions });
  app.name = name;
  window.jupyterapp = app;
  await app.start({ bubblingKeydown: true });
  await app.restored;
  return app;
}
