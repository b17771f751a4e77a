/**
 * Real JupyterLab objects for plugin tests: a JupyterLab application, a
 * notebook tracker, a setting registry loaded with our schema, and notebook
 * panels built from real notebook models whose outputs render through a real
 * RenderMimeRegistry. Nothing here talks to a server.
 */
import fs from 'node:fs';
import path from 'node:path';
import { ILayoutRestorer, JupyterLab, LayoutRestorer } from '@jupyterlab/application';
import type { LabShell } from '@jupyterlab/application';
import type { JupyterFrontEndPlugin } from '@jupyterlab/application';
import { CodeMirrorEditorFactory, EditorExtensionRegistry, EditorLanguageRegistry, ybinding } from '@jupyterlab/codemirror';
import { Context } from '@jupyterlab/docregistry';
import type { INotebookContent } from '@jupyterlab/nbformat';
import { INotebookTracker, Notebook, NotebookModelFactory, NotebookPanel, NotebookTracker } from '@jupyterlab/notebook';
import type { INotebookModel } from '@jupyterlab/notebook';
import { RenderMimeRegistry, standardRendererFactories } from '@jupyterlab/rendermime';
import { ServerConnection, ServiceManager } from '@jupyterlab/services';
import { ISettingRegistry, SettingRegistry } from '@jupyterlab/settingregistry';
import { StateDB } from '@jupyterlab/statedb';
import { ITranslator, nullTranslator } from '@jupyterlab/translation';
import type { ISettingRegistry as SettingRegistryTypes } from '@jupyterlab/settingregistry';
import type { IDataConnector } from '@jupyterlab/statedb';
import type { ReadonlyPartialJSONObject } from '@lumino/coreutils';

export const repoRoot = path.resolve(__dirname, '..', '..');

/** A ServiceManager whose requests fail at once instead of reaching a network. */
export function offlineServiceManager(): ServiceManager {
  const serverSettings = ServerConnection.makeSettings({
    baseUrl: 'http://offline.invalid/',
    fetch: () => Promise.reject(new TypeError('offline test harness: no server')),
    WebSocket: class {
      constructor() {
        throw new Error('offline test harness: no websocket');
      }
    } as unknown as typeof WebSocket
  });
  return new ServiceManager({ serverSettings, standby: 'never' });
}

/** Setting registry backed by an in-memory StateDB, serving our real schema. */
export function settingRegistryWith(pluginId: string): SettingRegistry {
  const schema = JSON.parse(fs.readFileSync(path.join(repoRoot, 'schema', 'settings', 'plugin.json'), 'utf8'));
  const db = new StateDB();
  const connector: IDataConnector<SettingRegistryTypes.IPlugin, string> = {
    async fetch(id: string) {
      const raw = ((await db.fetch(id)) as string | undefined) ?? '{}';
      return { id, schema, raw, data: { composite: {}, user: {} }, version: 'test' } as SettingRegistryTypes.IPlugin;
    },
    async list() {
      return { ids: [pluginId], values: [await connector.fetch(pluginId)] as SettingRegistryTypes.IPlugin[] };
    },
    async save(id: string, raw: string) {
      await db.save(id, raw);
    },
    async remove(id: string) {
      await db.remove(id);
    }
  };
  return new SettingRegistry({ connector });
}

function editorFactory() {
  const extensions = new EditorExtensionRegistry();
  extensions.addExtension({
    name: 'binding',
    factory: ({ model }) =>
      EditorExtensionRegistry.createImmutableExtension(
        ybinding({ ytext: (model.sharedModel as unknown as { ysource: never }).ysource })
      )
  });
  const factory = new CodeMirrorEditorFactory({ languages: new EditorLanguageRegistry(), extensions });
  return factory.newInlineEditor.bind(factory);
}

/** Read a committed notebook (nbformat JSON with line lists, as on disk). */
export function readNotebook(rel: string): INotebookContent {
  return JSON.parse(fs.readFileSync(path.join(repoRoot, rel), 'utf8')) as INotebookContent;
}

/** A real NotebookPanel showing `content`, at `notebookPath`. */
export async function notebookPanel(manager: ServiceManager, notebookPath: string, content: INotebookContent): Promise<NotebookPanel> {
  const context = new Context<INotebookModel>({
    manager,
    factory: new NotebookModelFactory({}),
    path: notebookPath
  });
  context.model.fromJSON(content);
  const rendermime = new RenderMimeRegistry({ initialFactories: standardRendererFactories });
  const notebook = new Notebook({
    rendermime,
    contentFactory: new NotebookPanel.ContentFactory({ editorFactory: editorFactory() }),
    mimeTypeService: { getMimeTypeByLanguage: () => 'text/x-python', getMimeTypeByFilePath: () => 'text/x-python' },
    notebookConfig: { ...Notebook.defaultNotebookConfig, windowingMode: 'none' }
  });
  const panel = new NotebookPanel({ context, content: notebook });
  return panel;
}

const labs: JupyterLab[] = [];

/**
 * Dispose every application made by {@link labWith} and let React finish the
 * work it scheduled (toolbars render through React), so nothing runs after the
 * test environment is torn down. Call it in `afterEach`.
 */
export async function disposeLabs(): Promise<void> {
  for (const app of labs.splice(0)) {
    app.shell.dispose();
  }
  for (let i = 0; i < 3; i++) {
    await new Promise(resolve => setTimeout(resolve, 20));
  }
  document.body.innerHTML = '';
}

/** Options of {@link labWith}. */
export interface ILabOptions {
  /**
   * Provide a real LayoutRestorer over this state database (as a lab's
   * workspace): trackers restore from it when the application starts. The
   * layout is then restored in the background (`layoutRestored`), so the test
   * can open notebooks the restored widgets wait for.
   */
  state?: StateDB;
}

/** A JupyterLab application with a tracker, a setting registry and a translator. */
export async function labWith(plugins: JupyterFrontEndPlugin<unknown>[], pluginId: string, options: ILabOptions = {}) {
  const serviceManager = offlineServiceManager();
  const app = new JupyterLab({ serviceManager });
  labs.push(app);
  const restorer = options.state ? new LayoutRestorer({ connector: options.state, first: app.started, registry: app.commands }) : null;
  const tracker = new NotebookTracker({ namespace: 'psiscape-test' });
  const registry = settingRegistryWith(pluginId);
  const providers: JupyterFrontEndPlugin<unknown>[] = [
    { id: 'test:tracker', description: 'test notebook tracker', provides: INotebookTracker, activate: () => tracker },
    { id: 'test:settings', description: 'test setting registry', provides: ISettingRegistry, activate: () => registry },
    { id: 'test:translator', description: 'test translator', provides: ITranslator, activate: () => nullTranslator },
    ...(restorer ? [{ id: 'test:restorer', description: 'test layout restorer', provides: ILayoutRestorer, activate: () => restorer }] : [])
  ];
  for (const p of [...providers, ...plugins]) {
    app.registerPlugin(p);
  }
  // start() attaches the shell, listens for context-menu events and activates
  // every auto-start plugin, as in a running lab.
  await app.start({ ignorePlugins: [] });
  for (const p of plugins) {
    await app.activatePlugin(p.id);
  }
  // The shell holds added widgets back until a layout is restored, as at start-up.
  const layoutRestorer = restorer ?? new LayoutRestorer({ connector: new StateDB(), first: Promise.resolve(), registry: app.commands });
  const layoutRestored = (app.shell as LabShell).restoreLayout('multiple-document', layoutRestorer);
  if (!restorer) {
    await layoutRestored;
  }
  return { app, tracker, registry, serviceManager, restorer: layoutRestorer, layoutRestored };
}

/** Add a panel to the shell and to the tracker, and make it current. */
export async function openInLab(
  lab: Awaited<ReturnType<typeof labWith>>,
  notebookPath: string,
  content: INotebookContent,
  options: { ready?: boolean | Promise<void> } = {}
): Promise<NotebookPanel> {
  const panel = await notebookPanel(lab.serviceManager, notebookPath, content);
  if (options.ready) {
    // As a notebook read from disk: its context is ready (nothing here talks to a server),
    // at once or when the given promise resolves.
    let isReady = options.ready === true;
    const ready = options.ready === true ? Promise.resolve() : options.ready.then(() => void (isReady = true));
    Object.defineProperty(panel.context, 'ready', { value: ready });
    Object.defineProperty(panel.context, 'isReady', { get: () => isReady });
  }
  panel.id = `nb-${notebookPath.replace(/\W/g, '-')}`;
  lab.app.shell.add(panel, 'main');
  await lab.tracker.add(panel);
  lab.app.shell.activateById(panel.id);
  return panel;
}

export type { ReadonlyPartialJSONObject };
