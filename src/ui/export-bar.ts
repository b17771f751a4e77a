/**
 * The analysis panel's export toolbar: the current fit's result copied as
 * Markdown, LaTeX or CSV, or saved as JSON (schema/analysis-result.v1.json);
 * the chart saved as SVG or PNG; the chart's Vega-Lite spec copied. Files are
 * written beside the notebook through JupyterLab's contents service (the
 * host's `save`), so they appear in the file browser like any other file.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import type { View } from 'vega';
import type { IAnalysisReport } from '../core/analysis/report';
import { dataCsv, notebookOutputs, reportCsv, reportLatex, reportMarkdown } from '../core/analysis/report';
import type { IDisplayOutput, IFittedPoints } from '../core/analysis/report';
import type { TopLevelSpec } from 'vega-lite';
import { exportChart } from './chart-view';

/** What the export toolbar needs from the lab. */
export interface IExportHost {
  /** psiscape's version, written into every export. */
  psiscapeVersion: string;
  /** Put text on the system clipboard. */
  copy(text: string): void;
  /** Save a file beside the analysed notebook or file; resolves with the path written. */
  save(name: string, content: string, format: 'text' | 'base64'): Promise<string>;
  /**
   * Put the analysis into its notebook as saved cell outputs, below its source
   * cell (or in place of the outputs inserted before for the same analysis);
   * resolves with where ("cell 5"). Absent for analyses of files.
   */
  insert?(outputs: IDisplayOutput[], analysisId: string, caption: string): Promise<string>;
}

/** What the toolbar exports, read from the panel at the moment of the click. */
export interface IExportSource {
  /** The current fit's record, or null when no fit of the data and settings now chosen is shown. */
  report(): IAnalysisReport | null;
  /** Whether report() would give a record (cheap: read on every redraw to enable the buttons). */
  hasResult(): boolean;
  /** The chart's Vega view, or null before it is drawn. */
  view(): View | null;
  /** The Vega-Lite spec of the chart drawn, or null. */
  spec(): unknown;
  /** Short name for files: the notebook or file name without its extension. */
  baseName(): string;
  /** The analysis's id and its saved form (plotted data and settings), for the notebook output. */
  analysis(): { id: string; saved: unknown };
  /** The chart's size on screen, in CSS pixels. */
  chartSize(): { width: number; height: number };
  /** The points of the current fit with their residuals, or null. */
  fitted(): IFittedPoints | null;
}

/** The export actions, by id (also the commands' argument). */
export type ExportAction = 'insert' | 'markdown' | 'latex' | 'csv' | 'data' | 'json' | 'svg' | 'png' | 'vega-lite';

/** PNG pixels per chart pixel (sharp on high-density screens and in print). */
export const PNG_SCALE = 2;

/** Toolbar of export actions. */
export class ExportBar extends Widget {
  constructor(options: { trans: TranslationBundle; host: IExportHost; source: IExportSource }) {
    super();
    this._trans = options.trans;
    this._host = options.host;
    this._source = options.source;
    this.addClass('jp-psiscape-ExportBar');
    this.node.setAttribute('role', 'toolbar');
    this.node.setAttribute('aria-label', this._trans.__('Export'));
    const trans = this._trans;
    const labels: [ExportAction, string, string][] = [
      ...(this._host.insert
        ? ([['insert', trans.__('Insert into notebook'), trans.__('Add the chart and the results below the source cell as saved outputs, readable without psiscape or a kernel (again: update them in place)')]] as [ExportAction, string, string][])
        : []),
      ['markdown', trans.__('Copy as Markdown'), trans.__('Copy the fit result as a Markdown table (numbers as in the panel)')],
      ['latex', trans.__('Copy as LaTeX'), trans.__('Copy the fit result as a LaTeX tabular in value(uncertainty) notation')],
      ['csv', trans.__('Copy as CSV'), trans.__('Copy the fitted parameters as CSV, at full precision')],
      ['data', trans.__('Save data + model (CSV)'), trans.__('Save the fitted points with the model, the residuals and (with σ) the normalised residuals as CSV beside the notebook')],
      ['json', trans.__('Save result (JSON)'), trans.__('Save the whole result — values, errors, covariance, verdict, window, source — as JSON beside the notebook')],
      ['svg', trans.__('Save chart (SVG)'), trans.__('Save the chart as an SVG file beside the notebook, at the size chosen below (blank: as shown)')],
      ['png', trans.__('Save chart (PNG)'), trans.__('Save the chart as a PNG file beside the notebook, at the size and scale chosen below')],
      ['vega-lite', trans.__('Copy Vega-Lite'), trans.__('Copy the chart’s Vega-Lite specification')]
    ];
    const row = document.createElement('div');
    row.className = 'jp-psiscape-ExportBar-buttons';
    for (const [action, label, caption] of labels) {
      const b = document.createElement('button');
      b.type = 'button';
      b.className = `jp-Button jp-mod-styled jp-mod-reject jp-psiscape-export-${action}`;
      b.textContent = label;
      b.title = caption;
      b.addEventListener('click', () => void this.run(action));
      this._buttons.set(action, b);
      row.appendChild(b);
    }
    // Size and scale of saved charts: blank size means as shown.
    const size = document.createElement('div');
    size.className = 'jp-psiscape-ExportBar-size';
    const field = (cls: string, label: string, placeholder: string): HTMLInputElement => {
      const wrap = document.createElement('label');
      const span = document.createElement('span');
      span.textContent = label;
      const input = document.createElement('input');
      input.type = 'number';
      input.min = '50';
      input.max = '4000';
      input.step = '10';
      input.className = `jp-mod-styled ${cls}`;
      input.placeholder = placeholder;
      wrap.append(span, input);
      size.appendChild(wrap);
      return input;
    };
    this._width = field('jp-psiscape-export-width', trans.__('saved chart width (px)'), trans.__('as shown'));
    this._height = field('jp-psiscape-export-height', trans.__('height (px)'), trans.__('as shown'));
    const scaleLabel = document.createElement('label');
    const scaleSpan = document.createElement('span');
    scaleSpan.textContent = trans.__('PNG scale');
    this._scale = document.createElement('select');
    this._scale.className = 'jp-mod-styled jp-psiscape-export-scale';
    for (const k of [1, 2, 3, 4]) {
      const o = document.createElement('option');
      o.value = String(k);
      o.textContent = `${k}×`;
      o.selected = k === PNG_SCALE;
      this._scale.appendChild(o);
    }
    scaleLabel.append(scaleSpan, this._scale);
    size.appendChild(scaleLabel);
    this.node.appendChild(size);
    this._status = document.createElement('span');
    this._status.className = 'jp-psiscape-ExportBar-status';
    this._status.setAttribute('aria-live', 'polite');
    this.node.append(row, this._status);
    this.update();
  }

  /** Whether an action has something to export now. */
  canRun(action: ExportAction): boolean {
    switch (action) {
      case 'insert':
        return this._host.insert !== undefined && this._source.hasResult() && this._source.view() !== null;
      case 'markdown':
      case 'latex':
      case 'csv':
      case 'json':
      case 'data':
        return this._source.hasResult();
      case 'svg':
      case 'png':
        return this._source.view() !== null;
      case 'vega-lite':
        return this._source.spec() !== null;
    }
  }

  /** Enable the buttons that have something to export. */
  update(): void {
    for (const [action, b] of this._buttons) {
      b.disabled = !this.canRun(action);
    }
  }

  /** Run one action; resolves with the status text shown. */
  async run(action: ExportAction): Promise<string> {
    const trans = this._trans;
    let text: string;
    try {
      text = await this._run(action);
    } catch (reason) {
      text = trans.__('Could not export: %1', reason instanceof Error ? reason.message : String(reason));
    }
    this._status.textContent = text;
    return text;
  }

  private async _run(action: ExportAction): Promise<string> {
    const trans = this._trans;
    const report = this._source.report();
    const base = this._source.baseName();
    switch (action) {
      case 'insert': {
        const view = this._source.view();
        if (!report || !view || !this._host.insert) {
          return trans.__('Run a fit first: there is no result of the data and settings now chosen.');
        }
        const url = await view.toImageURL('png', PNG_SCALE);
        const { width, height } = this._source.chartSize();
        const { id, saved } = this._source.analysis();
        const outputs = notebookOutputs({ report, png: url.slice(url.indexOf(',') + 1), pngScale: PNG_SCALE, width, height, svg: await view.toSVG(), spec: this._source.spec(), analysis: saved });
        const where = await this._host.insert(outputs, id, `${report.kindLabel}: ${report.columns.y.header} against ${report.columns.x.header}`);
        return trans.__('Inserted into the notebook (%1). Save the notebook to keep it.', where);
      }
      case 'markdown':
      case 'latex':
      case 'csv': {
        if (!report) {
          return trans.__('Run a fit first: there is no result of the data and settings now chosen.');
        }
        const write = action === 'markdown' ? reportMarkdown : action === 'latex' ? reportLatex : reportCsv;
        this._host.copy(write(report));
        return action === 'markdown' ? trans.__('Copied the result as Markdown.') : action === 'latex' ? trans.__('Copied the result as LaTeX.') : trans.__('Copied the parameters as CSV.');
      }
      case 'json': {
        if (!report) {
          return trans.__('Run a fit first: there is no result of the data and settings now chosen.');
        }
        const path = await this._host.save(`${base} ${report.kind} result.json`, JSON.stringify(report, null, 1) + '\n', 'text');
        return trans.__('Saved %1.', path);
      }
      case 'data': {
        const points = this._source.fitted();
        if (!report) {
          return trans.__('Run a fit first: there is no result of the data and settings now chosen.');
        }
        if (!points) {
          return trans.__('This fit does not keep one residual per data point, so its points cannot be saved with the model.');
        }
        const path = await this._host.save(`${base} ${report.kind} data.csv`, dataCsv(report, points), 'text');
        return trans.__('Saved %1.', path);
      }
      case 'svg':
      case 'png': {
        const view = this._source.view();
        const spec = this._source.spec() as TopLevelSpec | null;
        if (!view || !spec) {
          return trans.__('There is no chart to save yet.');
        }
        const scale = Number(this._scale.value) || PNG_SCALE;
        const width = Number(this._width.value);
        const height = Number(this._height.value);
        const chosen = width >= 50 && height >= 50;
        if ((this._width.value || this._height.value) && !chosen) {
          return trans.__('Give both a width and a height of at least 50 px, or leave both blank for the chart as shown.');
        }
        const content = chosen
          ? await exportChart(spec, { width, height, format: action, scale })
          : action === 'svg'
            ? await view.toSVG()
            : await view.toImageURL('png', scale);
        const text = action === 'svg' ? content : content.slice(content.indexOf(',') + 1);
        const path = await this._host.save(`${base} chart.${action}`, text, action === 'svg' ? 'text' : 'base64');
        return trans.__('Saved %1.', path);
      }
      case 'vega-lite': {
        const spec = this._source.spec();
        if (spec === null) {
          return trans.__('There is no chart to copy yet.');
        }
        this._host.copy(JSON.stringify(spec, null, 1));
        return trans.__('Copied the chart’s Vega-Lite specification.');
      }
    }
  }

  private _trans: TranslationBundle;
  private _host: IExportHost;
  private _source: IExportSource;
  private _buttons = new Map<ExportAction, HTMLButtonElement>();
  private _status: HTMLSpanElement;
  private _width: HTMLInputElement;
  private _height: HTMLInputElement;
  private _scale: HTMLSelectElement;
}
