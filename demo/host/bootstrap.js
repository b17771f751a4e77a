// Entry of psiscape's lab frontend (both flavours). Loads every prebuilt (federated) extension named in
// the page configuration *before* the application chunk, so that webpack's
// shared-module negotiation sees all containers, then starts the app.

function configOption(name) {
  const el = document.getElementById('jupyter-config-data');
  const data = el ? JSON.parse(el.textContent || '{}') : {};
  return data[name] || '';
}

__webpack_public_path__ = configOption('fullStaticUrl') + '/';

function loadScript(url) {
  return new Promise((resolve, reject) => {
    const script = document.createElement('script');
    script.onerror = () => reject(new Error(`could not load ${url}`));
    script.onload = resolve;
    script.async = true;
    document.head.appendChild(script);
    script.src = url;
  });
}

async function loadContainer(baseUrl, data) {
  await loadScript(`${baseUrl}/${data.name}/${data.load}`);
  await __webpack_init_sharing__('default');
  const container = window._JUPYTERLAB[data.name];
  await container.init(__webpack_share_scopes__.default);
}

void (async function bootstrap() {
  const extensions = configOption('federated_extensions') || [];
  const baseUrl = configOption('fullLabextensionsUrl');
  const loaded = await Promise.allSettled(extensions.map(data => loadContainer(baseUrl, data)));
  loaded.forEach(result => {
    if (result.status === 'rejected') {
      console.error(result.reason);
    }
  });
  const { main } = await import('./main.js');
  await main();
})();
