/**
 * psiscape's MIME renderer: draws psiscape's own output type
 * (application/vnd.psiscape.analysis.v1+json, written by "Insert into
 * notebook") as a live analysis. Declared safe: the payload is validated and
 * only its numbers, headers and settings are used (src/ui/inline-analysis.ts),
 * so collaborators' untrusted notebooks show it too.
 *
 * Loaded at JupyterLab start, so it is tiny: the analysis code loads when the
 * first such output is drawn.
 */
import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { nullTranslator } from '@jupyterlab/translation';
import { Panel } from '@lumino/widgets';
import { ANALYSIS_MIME } from '../core/analysis/report/notebook-output';

/** An output's renderer: a panel that holds the live analysis once its code has loaded. */
class AnalysisOutputRenderer extends Panel implements IRenderMime.IRenderer {
  constructor(private readonly _options: IRenderMime.IRendererOptions) {
    super();
    this.addClass('jp-psiscape-AnalysisOutput');
  }

  async renderModel(model: IRenderMime.IMimeModel): Promise<void> {
    const { renderInlineAnalysis } = await import(/* webpackChunkName: "psiscape-workbench" */ '../ui/inline-analysis');
    if (!this.isDisposed) {
      renderInlineAnalysis(this, model.data[ANALYSIS_MIME], this._options.translator ?? nullTranslator);
    }
  }
}

const extension: IRenderMime.IExtension = {
  id: 'jupyterlab-psiscape:analysis-output',
  description: 'Draws psiscape analyses inserted into notebooks as live analyses, without a kernel.',
  rendererFactory: {
    safe: true,
    mimeTypes: [ANALYSIS_MIME],
    defaultRank: 10,
    createRenderer: options => new AnalysisOutputRenderer(options)
  },
  // Preferred over the HTML, Markdown and image copies of the same output.
  rank: 10,
  dataType: 'json'
};

export default extension;
