// The packages psiscape's lab frontend is assembled from. One list, read by the
// webpack configuration (schemas, themes, styles, host-packages.js); main.js
// picks the plugins of the flavour the page configuration asks for.

/** JupyterLab extension packages (plugins). */
const labExtensions = [
  '@jupyterlab/application-extension',
  '@jupyterlab/apputils-extension',
  '@jupyterlab/cell-toolbar-extension',
  '@jupyterlab/codemirror-extension',
  '@jupyterlab/completer-extension',
  '@jupyterlab/csvviewer-extension',
  '@jupyterlab/docmanager-extension',
  '@jupyterlab/documentsearch-extension',
  '@jupyterlab/filebrowser-extension',
  '@jupyterlab/mainmenu-extension',
  '@jupyterlab/markedparser-extension',
  '@jupyterlab/metadataform-extension',
  '@jupyterlab/notebook-extension',
  '@jupyterlab/rendermime-extension',
  '@jupyterlab/services-extension',
  '@jupyterlab/settingeditor-extension',
  '@jupyterlab/shortcuts-extension',
  '@jupyterlab/statusbar-extension',
  '@jupyterlab/theme-dark-extension',
  '@jupyterlab/theme-light-extension',
  '@jupyterlab/toc-extension',
  '@jupyterlab/translation-extension',
  '@jupyterlab/ui-components-extension'
];

/** MIME renderer extension packages. */
const mimeExtensions = ['@jupyterlab/javascript-extension', '@jupyterlab/json-extension'];

/** In-browser service plugins: contents, settings and sessions without a server. */
const liteExtensions = [
  '@jupyterlite/application-extension',
  '@jupyterlite/apputils-extension',
  '@jupyterlite/services-extension'
];

/** Plugins left out in every flavour: the language-server client needs an LSP extension (not included). */
const alwaysDisabled = ['@jupyterlab/notebook-extension:language-server', '@jupyterlab/apputils-extension:announcements'];

/**
 * Plugins left out per flavour.
 * - inBrowser (the kernel-free demo): plugins that need a server, clash with the
 *   in-browser services, or offer downloads and links that have no meaning here.
 * - server (a real Jupyter server): announcements poll a news API that
 *   jupyterlab_server does not offer.
 */
const disabledPlugins = {
  inBrowser: [
    ...alwaysDisabled,
    '@jupyterlite/application-extension:service-worker-manager',
    '@jupyterlite/application-extension:opener',
    '@jupyterlite/application-extension:lsp-connection-manager',
    '@jupyterlite/application-extension:share-file',
    '@jupyterlite/application-extension:download',
    '@jupyterlab/services-extension:connection-status',
    '@jupyterlab/services-extension:terminal-manager',
    '@jupyterlab/services-extension:default-content-provider',
    '@jupyterlab/services-extension:content-provider-warning',
    '@jupyterlab/docmanager-extension:download',
    '@jupyterlab/filebrowser-extension:download',
    '@jupyterlab/filebrowser-extension:share-file'
  ],
  server: [...alwaysDisabled]
};

module.exports = { labExtensions, mimeExtensions, liteExtensions, disabledPlugins };
