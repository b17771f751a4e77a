/**
 * jupyterlab-psiscape: phase-transition analysis of notebook tables in JupyterLab.
 *
 * The default export is the list of JupyterLab plugins; the numerical core is
 * importable on its own from `jupyterlab-psiscape/lib/core/...`.
 *
 * @packageDocumentation
 */
export { default } from './plugins';
export { PLUGIN_ID } from './plugins';
