/**
 * Field sweeps in the analysis panel: a long-format table of M(H) isotherms
 * (temperature, field, magnetisation columns) → Arrott plot, Tc, β, γ, δ by
 * modified Arrott, Kouvel–Fisher and the critical isotherm, the Banerjee
 * evidence and every warning (demagnetisation, units, too few isotherms).
 * The analysis takes tens of milliseconds, so it runs on the main thread.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { buildArrottSpec } from '../charts/sweeps';
import { formatWithError } from '../core/analysis';
import type { IIsothermAnalysis, IIsothermSet, ISampleInfo } from '../core/sweeps';
import { analyseIsotherms, buildIsothermSet } from '../core/sweeps';
import type { IColumn, ITable } from '../core/table';
import { guessIsothermRoles } from '../core/table/roles';
import type { IsothermRole } from '../core/table/roles';
import { ChartView } from './chart-view';
import { readChartTheme } from './chart-theme';
import { outcomeNodes } from './outcome-nodes';
import { translateMessage } from './translate';
import { messageOf } from '../core/messages';
import type { ISavedIsotherms } from '../core/saved/types';

type Role = IsothermRole;

/** Isotherm controls and results. */
export class IsothermSection extends Panel {
  constructor(options: { trans: TranslationBundle; onRun?: (settings: ISavedIsotherms) => void }) {
    super();
    this._trans = options.trans;
    this._onRun = options.onRun ?? null;
    this.addClass('jp-psiscape-IsothermSection');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', this._trans.__('Isotherms'));
    this._chart = new ChartView();
    this._build();
  }

  /** The latest analysis, or null. */
  get analysis(): IIsothermAnalysis | null {
    return this._analysis;
  }

  /** Resolves when the latest Arrott plot has been drawn. */
  get rendered(): Promise<void> {
    return this._rendered;
  }

  /** A new table: refill the column pickers and clear the results. */
  setTable(table: ITable | null): void {
    this._table = table;
    this._analysis = null;
    this._result.replaceChildren();
    this._chart.clear();
    this._chart.hide();
    this._error.hidden = true;
    const numeric = (table?.columns ?? []).map((c, i) => ({ c, i })).filter(({ c }) => c.kind === 'number');
    // Shown for tables that look like field sweeps: three numeric columns, one of them a field.
    const guessed = guessIsothermRoles(table);
    this.setHidden(!guessed.looksLikeSweeps);
    for (const role of ['temperature', 'field', 'magnetisation'] as Role[]) {
      const select = this._pickers[role];
      select.replaceChildren(
        ...numeric.map(({ c, i }) => {
          const o = document.createElement('option');
          o.value = String(i);
          o.textContent = c.header;
          return o;
        })
      );
      const guess = guessed.roles[role];
      if (guess !== null) {
        select.value = String(guess);
      }
      this._units[role].value = '';
    }
  }

  /** The controls as saved with the analysis (columns by position and header), or null without a table. */
  settings(): ISavedIsotherms | null {
    const table = this._table;
    if (!table) {
      return null;
    }
    const ref = (role: Role) => {
      const index = Number(this._pickers[role].value);
      return { index, header: table.columns[index]?.header ?? '' };
    };
    const text = (input: HTMLInputElement): string | null => (input.value.trim() ? input.value.trim() : null);
    return {
      columns: { temperature: ref('temperature'), field: ref('field'), magnetisation: ref('magnetisation') },
      units: { temperature: text(this._units.temperature), field: text(this._units.field), magnetisation: text(this._units.magnetisation) },
      demagnetisingFactorSI: text(this._demag),
      temperatureToleranceK: text(this._tolerance),
      sampleMassMg: text(this._mass),
      densityGPerCm3: text(this._density)
    };
  }

  /**
   * Set the controls from saved settings and run the analysis. Columns are
   * matched by position and header; a column that is not there any more
   * leaves the guessed one and says so.
   */
  restore(saved: ISavedIsotherms): void {
    const table = this._table;
    if (!table) {
      return;
    }
    const missing: string[] = [];
    for (const role of ['temperature', 'field', 'magnetisation'] as Role[]) {
      const ref = saved.columns[role];
      const column = table.columns[ref.index];
      if (column && column.header === ref.header && column.kind === 'number') {
        this._pickers[role].value = String(ref.index);
      } else {
        missing.push(ref.header);
      }
      this._units[role].value = saved.units[role] ?? '';
    }
    this._demag.value = saved.demagnetisingFactorSI ?? '';
    this._tolerance.value = saved.temperatureToleranceK ?? '';
    this._mass.value = saved.sampleMassMg ?? '';
    this._density.value = saved.densityGPerCm3 ?? '';
    this.run({ quiet: true });
    if (missing.length > 0) {
      this._fail(this._trans.__('The saved isotherm analysis used the columns %1, which are not in the table any more.', missing.join(', ')));
    }
  }

  /** Run the analysis with the current controls (`quiet`: a restore, not a user's change). */
  run(options: { quiet?: boolean } = {}): void {
    this._error.hidden = true;
    const table = this._table;
    if (!table) {
      return;
    }
    if (!options.quiet) {
      const settings = this.settings();
      if (settings) {
        this._onRun?.(settings);
      }
    }
    const column = (role: Role): IColumn => table.columns[Number(this._pickers[role].value)];
    const overrides: Record<string, string> = {};
    for (const role of ['temperature', 'field', 'magnetisation'] as Role[]) {
      if (this._units[role].value.trim()) {
        overrides[column(role).name] = this._units[role].value.trim();
      }
    }
    const nd = this._demag.value.trim();
    const ndValue = Number(nd);
    if (nd && !(Number.isFinite(ndValue) && ndValue >= 0 && ndValue <= 1)) {
      this._fail(this._trans.__('The demagnetising factor N_d (SI) must be a number from 0 to 1, got "%1".', nd));
      return;
    }
    const sample: ISampleInfo = {};
    const mass = Number(this._mass.value);
    if (this._mass.value.trim() && mass > 0) {
      sample.massKg = mass * 1e-6;
    }
    const density = Number(this._density.value);
    if (this._density.value.trim() && density > 0) {
      sample.densityKgPerM3 = density * 1000;
    }
    const tolText = this._tolerance.value.trim();
    const tolerance = Number(tolText);
    if (tolText && !(Number.isFinite(tolerance) && tolerance > 0)) {
      this._fail(this._trans.__('The temperature grouping tolerance must be a positive number of kelvin, got "%1".', tolText));
      return;
    }
    let answer: ReturnType<typeof buildIsothermSet>;
    try {
      answer = buildIsothermSet({
      temperatureTolerance: tolText ? tolerance : undefined,
      temperature: column('temperature'),
      field: column('field'),
      magnetisation: column('magnetisation'),
      demag: nd ? { value: ndValue, convention: 'SI' } : undefined,
      sample,
      unitOverrides: overrides
    });
    } catch (e) {
      this._fail(translateMessage(this._trans, messageOf(e)));
      return;
    }
    if (answer.status !== 'ok') {
      const reason = translateMessage(this._trans, answer.message);
      this._fail(answer.status === 'needs-unit' ? this._trans.__('%1 Accepted units: %2.', reason, answer.options.join(', ')) : reason);
      return;
    }
    let analysis: IIsothermAnalysis;
    try {
      analysis = analyseIsotherms(answer.set);
    } catch (e) {
      this._fail(translateMessage(this._trans, messageOf(e)));
      return;
    }
    this._analysis = analysis;
    this._render(answer.set, analysis);
  }

  /** Redraw the plot (theme change). */
  redraw(): void {
    if (this._analysis && this._set) {
      this._draw(this._set, this._analysis);
    }
  }

  private _fail(message: string): void {
    this._error.textContent = this._trans.__('The isotherm analysis could not run: %1', message);
    this._error.hidden = false;
  }

  private _draw(set: IIsothermSet, analysis: IIsothermAnalysis): void {
    if (!this.isAttached) {
      return;
    }
    this._chart.show();
    const { spec } = buildArrottSpec({
      isotherms: set.isotherms,
      lines: analysis.arrott.lines,
      theme: readChartTheme(this.node),
      fieldKind: set.fieldKind,
      magnetisationUnit: set.magnetisationUnit
    });
    this._rendered = this._chart.render(spec, this._trans.__('Arrott plot'));
  }

  private _render(set: IIsothermSet, a: IIsothermAnalysis): void {
    this._set = set;
    this._draw(set, a);
    const rows: [string, string, string][] = [
      [this._trans.__('Tc, Arrott (intercept crossing)'), formatWithError(a.arrott.Tc.value, a.arrott.Tc.sigma), 'K'],
      [this._trans.__('Tc, modified Arrott'), formatWithError(a.modifiedArrott.Tc.value, a.modifiedArrott.Tc.sigma), 'K'],
      ['β', formatWithError(a.modifiedArrott.beta.value, a.modifiedArrott.beta.sigma), this._trans.__('modified Arrott')],
      ['γ', formatWithError(a.modifiedArrott.gamma.value, a.modifiedArrott.gamma.sigma), this._trans.__('modified Arrott')],
      ['δ', formatWithError(a.modifiedArrott.deltaWidom.value, a.modifiedArrott.deltaWidom.sigma), this._trans.__('Widom: 1 + γ/β')],
      ['δ', formatWithError(a.criticalIsotherm.delta.value, a.criticalIsotherm.delta.sigma), this._trans.__('critical isotherm (%1)', a.criticalIsotherm.source)],
      [this._trans.__('Tc, Kouvel–Fisher'), formatWithError(a.kouvelFisher.Tc.value, a.kouvelFisher.Tc.sigma), 'K'],
      ['β', formatWithError(a.kouvelFisher.below.exponent.value, a.kouvelFisher.below.exponent.sigma), this._trans.__('Kouvel–Fisher')],
      ['γ', formatWithError(a.kouvelFisher.above.exponent.value, a.kouvelFisher.above.exponent.sigma), this._trans.__('Kouvel–Fisher')]
    ];
    const table = document.createElement('table');
    table.className = 'jp-psiscape-fit-table jp-psiscape-isotherm-table';
    const head = table.createTHead().insertRow();
    for (const text of [this._trans.__('quantity'), this._trans.__('value ± standard error'), this._trans.__('method')]) {
      const th = document.createElement('th');
      th.scope = 'col';
      th.textContent = text;
      head.appendChild(th);
    }
    const body = table.createTBody();
    for (const r of rows) {
      const row = body.insertRow();
      r.forEach(text => (row.insertCell().textContent = text));
    }
    const count = document.createElement('p');
    count.textContent = this._trans._n('%1 isotherm', '%1 isotherms', set.isotherms.length) + ` · ${set.fieldKind === 'internal' ? this._trans.__('internal field') : this._trans.__('applied field (no demagnetisation correction)')}`;
    const banerjee = document.createElement('p');
    banerjee.className = 'jp-psiscape-isotherm-banerjee';
    banerjee.textContent = this._trans.__('Banerjee criterion: %1', translateMessage(this._trans, a.arrott.banerjee.evidence));
    const notes = document.createElement('ul');
    notes.className = 'jp-psiscape-fit-notes';
    const seen = new Set<string>();
    for (const w of [...a.warnings, ...a.arrott.banerjee.caveats]) {
      const text = translateMessage(this._trans, w);
      if (seen.has(text)) {
        continue;
      }
      seen.add(text);
      const li = document.createElement('li');
      li.className = 'jp-psiscape-fit-warning';
      li.textContent = text;
      notes.appendChild(li);
    }
    const conventions = document.createElement('p');
    conventions.className = 'jp-psiscape-fit-convention';
    conventions.textContent = [a.conventions.t, ...a.conventions.notes].map(m => translateMessage(this._trans, m)).join('; ');
    this._result.replaceChildren(count, table, banerjee, notes, conventions);
  }

  private _build(): void {
    const heading = document.createElement('h3');
    heading.textContent = this._trans.__('Isotherms M(H) at several temperatures');
    const row = document.createElement('div');
    row.className = 'jp-psiscape-fit-row';
    const labels: Record<Role, string> = {
      temperature: this._trans.__('temperature'),
      field: this._trans.__('field'),
      magnetisation: this._trans.__('magnetisation')
    };
    for (const role of ['temperature', 'field', 'magnetisation'] as Role[]) {
      const select = document.createElement('select');
      select.className = `jp-mod-styled jp-psiscape-iso-${role}`;
      this._pickers[role] = select;
      const unit = document.createElement('input');
      unit.type = 'text';
      unit.className = `jp-mod-styled jp-psiscape-iso-unit jp-psiscape-iso-${role}-unit`;
      unit.placeholder = this._trans.__('unit from header');
      unit.setAttribute('aria-label', this._trans.__('unit of the %1 column', labels[role]));
      this._units[role] = unit;
      const label = document.createElement('label');
      label.className = 'jp-psiscape-picker';
      const span = document.createElement('span');
      span.textContent = labels[role];
      label.append(span, select, unit);
      row.appendChild(label);
    }
    const row2 = document.createElement('div');
    row2.className = 'jp-psiscape-fit-row';
    const field = (cls: string, text: string, placeholder: string): HTMLInputElement => {
      const input = document.createElement('input');
      input.type = 'text';
      input.inputMode = 'decimal';
      input.className = `jp-mod-styled ${cls}`;
      input.placeholder = placeholder;
      const label = document.createElement('label');
      label.className = 'jp-psiscape-picker';
      const span = document.createElement('span');
      span.textContent = text;
      label.append(span, input);
      row2.appendChild(label);
      return input;
    };
    this._demag = field('jp-psiscape-iso-demag', this._trans.__('N_d (SI, 0–1)'), this._trans.__('unset'));
    this._tolerance = field('jp-psiscape-iso-tolerance', this._trans.__('same isotherm within (K)'), '0.5');
    this._mass = field('jp-psiscape-iso-mass', this._trans.__('sample mass (mg)'), '');
    this._density = field('jp-psiscape-iso-density', this._trans.__('density (g/cm³)'), '');
    const button = document.createElement('button');
    button.type = 'button';
    button.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-iso-run';
    button.textContent = this._trans.__('Analyse isotherms');
    button.addEventListener('click', () => this.run());
    row2.appendChild(button);
    ({ error: this._error, result: this._result } = outcomeNodes());
    const controls = new Widget();
    controls.node.append(heading, row, row2, this._error);
    const results = new Widget();
    results.node.appendChild(this._result);
    this.addWidget(controls);
    this.addWidget(this._chart);
    this.addWidget(results);
    this._chart.hide();
  }

  private _trans: TranslationBundle;
  private _onRun: ((settings: ISavedIsotherms) => void) | null;
  private _chart: ChartView;
  private _table: ITable | null = null;
  private _set: IIsothermSet | null = null;
  private _analysis: IIsothermAnalysis | null = null;
  private _rendered: Promise<void> = Promise.resolve();
  private _pickers = {} as Record<Role, HTMLSelectElement>;
  private _units = {} as Record<Role, HTMLInputElement>;
  private _demag!: HTMLInputElement;
  private _mass!: HTMLInputElement;
  private _tolerance!: HTMLInputElement;
  private _density!: HTMLInputElement;
  private _error!: HTMLParagraphElement;
  private _result!: HTMLDivElement;
}
