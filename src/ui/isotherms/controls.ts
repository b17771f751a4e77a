/**
 * The controls of the isotherm analysis: the three columns with their units,
 * the demagnetising factor (value, convention, sample-shape preset), the
 * field range, the exponent window, the grouping tolerance, mass and
 * density, and the bootstrap count. They are saved as typed (text) and read
 * into numbers here, each refused with its own message.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import type { ISavedIsotherms } from '../../core/saved/types';
import type { IIsothermControls } from '../../core/sweeps/job-types';
import type { ITable } from '../../core/table';
import { guessIsothermRoles } from '../../core/table/roles';
import type { IsothermRole } from '../../core/table/roles';
import { DEMAG_PRESETS, demagPresetValue } from '../../core/units/demag-shapes';

const ROLES: readonly IsothermRole[] = ['temperature', 'field', 'magnetisation'];

/** The controls read as numbers, or the first refusal in words. */
export type ControlsReading = { ok: true; controls: IIsothermControls; columns: Record<IsothermRole, number> } | { ok: false; message: string };

/** Builds and reads the isotherm controls. */
export class IsothermControls {
  constructor(trans: TranslationBundle, onRun: () => void, onCancel: () => void) {
    this._trans = trans;
    this.node = document.createElement('div');
    this.node.className = 'jp-psiscape-IsothermControls';
    this._build(onRun, onCancel);
  }

  /** The controls' container. */
  readonly node: HTMLDivElement;

  /** The Analyse button. */
  get runButton(): HTMLButtonElement {
    return this._run;
  }

  /** The Cancel button (shown while a run is going). */
  get cancelButton(): HTMLButtonElement {
    return this._cancel;
  }

  /** The view to show after a restore (set by the section). */
  view: string | null = null;

  /** Fill the column pickers for a table (the guessed roles chosen) and clear the units typed. */
  setTable(table: ITable | null): { looksLikeSweeps: boolean } {
    this._table = table;
    const numeric = (table?.columns ?? []).map((c, i) => ({ c, i })).filter(({ c }) => c.kind === 'number');
    const guessed = guessIsothermRoles(table);
    for (const role of ROLES) {
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
    this._updateFieldUnit();
    return { looksLikeSweeps: guessed.looksLikeSweeps };
  }

  /** The controls as saved (text as typed, null when blank), or null without a table. */
  settings(): ISavedIsotherms | null {
    const table = this._table;
    if (!table) {
      return null;
    }
    const ref = (role: IsothermRole) => {
      const index = Number(this._pickers[role].value);
      return { index, header: table.columns[index]?.header ?? '' };
    };
    const text = (input: HTMLInputElement): string | null => (input.value.trim() ? input.value.trim() : null);
    const cgs = this._convention.value === 'cgs';
    return {
      columns: { temperature: ref('temperature'), field: ref('field'), magnetisation: ref('magnetisation') },
      units: { temperature: text(this._units.temperature), field: text(this._units.field), magnetisation: text(this._units.magnetisation) },
      demagnetisingFactorSI: cgs ? null : text(this._demag),
      temperatureToleranceK: text(this._tolerance),
      sampleMassMg: text(this._mass),
      densityGPerCm3: text(this._density),
      demagnetisingConvention: cgs ? 'cgs' : 'SI',
      demagnetisingFactorCgs: cgs ? text(this._demag) : null,
      sampleShape: this._shape.value || null,
      fieldMin: text(this._fieldMin),
      fieldMax: text(this._fieldMax),
      tMax: text(this._tMax),
      bootstrapSamples: text(this._bootstrap),
      view: this.view
    };
  }

  /**
   * Set the controls from saved ones. Columns are matched by position and
   * header; the headers of the columns not found are returned.
   */
  restore(saved: ISavedIsotherms): string[] {
    const table = this._table;
    const missing: string[] = [];
    for (const role of ROLES) {
      const ref = saved.columns[role];
      const column = table?.columns[ref.index];
      if (column && column.header === ref.header && column.kind === 'number') {
        this._pickers[role].value = String(ref.index);
      } else {
        missing.push(ref.header);
      }
      this._units[role].value = saved.units[role] ?? '';
    }
    const cgs = saved.demagnetisingConvention === 'cgs';
    this._convention.value = cgs ? 'cgs' : 'SI';
    this._demag.value = (cgs ? saved.demagnetisingFactorCgs : saved.demagnetisingFactorSI) ?? '';
    this._shape.value = saved.sampleShape && [...this._shape.options].some(o => o.value === saved.sampleShape) ? saved.sampleShape : '';
    this._tolerance.value = saved.temperatureToleranceK ?? '';
    this._mass.value = saved.sampleMassMg ?? '';
    this._density.value = saved.densityGPerCm3 ?? '';
    this._fieldMin.value = saved.fieldMin ?? '';
    this._fieldMax.value = saved.fieldMax ?? '';
    this._tMax.value = saved.tMax ?? '';
    this._bootstrap.value = saved.bootstrapSamples ?? '';
    this.view = saved.view ?? null;
    this._updateFieldUnit();
    return missing;
  }

  /** The controls as numbers for the job, or the first value refused. */
  read(): ControlsReading {
    const t = this._trans;
    const number = (input: HTMLInputElement): number | null | string => {
      const text = input.value.trim().replace(/\u2212/g, '-');
      if (!text) {
        return null;
      }
      const v = Number(text);
      return Number.isFinite(v) ? v : input.value.trim();
    };
    const refuse = (message: string): ControlsReading => ({ ok: false, message });
    const cgs = this._convention.value === 'cgs';
    const nd = number(this._demag);
    const limit = cgs ? 4 * Math.PI : 1;
    if (typeof nd === 'string' || (nd !== null && !(nd >= 0 && nd <= limit))) {
      return refuse(
        cgs
          ? t.__('The demagnetising factor N_d (cgs) must be a number from 0 to 4π ≈ 12.57, got "%1".', this._demag.value.trim())
          : t.__('The demagnetising factor N_d (SI) must be a number from 0 to 1, got "%1".', this._demag.value.trim())
      );
    }
    const positive = (input: HTMLInputElement, what: string): number | null | ControlsReading => {
      const v = number(input);
      if (typeof v === 'string' || (v !== null && !(v > 0))) {
        return refuse(t.__('%1 must be a positive number, got "%2".', what, input.value.trim()));
      }
      return v;
    };
    const tolerance = positive(this._tolerance, t.__('The grouping tolerance (K)'));
    const mass = positive(this._mass, t.__('The sample mass (mg)'));
    const density = positive(this._density, t.__('The density (g/cm³)'));
    const tMax = positive(this._tMax, t.__('The |t| window'));
    for (const v of [tolerance, mass, density, tMax]) {
      if (v !== null && typeof v === 'object') {
        return v;
      }
    }
    if (typeof tMax === 'number' && tMax >= 1) {
      return refuse(t.__('The |t| window must be below 1 (it is a fraction of Tc), got "%1".', this._tMax.value.trim()));
    }
    const fieldMin = number(this._fieldMin);
    const fieldMax = number(this._fieldMax);
    for (const [v, input] of [
      [fieldMin, this._fieldMin],
      [fieldMax, this._fieldMax]
    ] as const) {
      if (typeof v === 'string') {
        return refuse(t.__('A field limit must be a number in the field column\'s unit, got "%1".', input.value.trim()));
      }
    }
    if (typeof fieldMin === 'number' && typeof fieldMax === 'number' && !(fieldMin < fieldMax)) {
      return refuse(t.__('The lowest field (%1) must be below the highest (%2).', String(fieldMin), String(fieldMax)));
    }
    const boot = number(this._bootstrap);
    if (typeof boot === 'string' || (boot !== null && !(Number.isInteger(boot) && (boot === 0 || (boot >= 10 && boot <= 1000))))) {
      return refuse(t.__('The bootstrap count must be 0 (none) or a whole number from 10 to 1000, got "%1".', this._bootstrap.value.trim()));
    }
    const unit = (role: IsothermRole): string | null => this._units[role].value.trim() || null;
    return {
      ok: true,
      columns: { temperature: Number(this._pickers.temperature.value), field: Number(this._pickers.field.value), magnetisation: Number(this._pickers.magnetisation.value) },
      controls: {
        units: { temperature: unit('temperature'), field: unit('field'), magnetisation: unit('magnetisation') },
        demag: nd === null ? null : { value: nd, convention: cgs ? 'cgs' : 'SI' },
        temperatureToleranceK: tolerance as number | null,
        sampleMassMg: mass as number | null,
        densityGPerCm3: density as number | null,
        fieldMin: fieldMin as number | null,
        fieldMax: fieldMax as number | null,
        tMax: tMax as number | null,
        bootstrapSamples: boot as number | null
      }
    };
  }

  /** The field column's unit as typed or read from its header, for the field-range labels. */
  fieldUnit(): string {
    const typed = this._units.field.value.trim();
    if (typed) {
      return typed;
    }
    const column = this._table?.columns[Number(this._pickers.field.value)];
    return column?.unit ?? this._trans.__('unit of the field column');
  }

  /** Set running state: Analyse disabled, Cancel shown. */
  setRunning(running: boolean): void {
    this._run.disabled = running;
    this._cancel.hidden = !running;
  }

  private _updateFieldUnit(): void {
    const unit = this.fieldUnit();
    for (const span of this._fieldUnitLabels) {
      span.textContent = unit;
    }
  }

  private _build(onRun: () => void, onCancel: () => void): void {
    const t = this._trans;
    const heading = document.createElement('h3');
    heading.textContent = t.__('Isotherms M(H) at several temperatures');
    const intro = document.createElement('p');
    intro.className = 'jp-psiscape-IsothermControls-intro';
    intro.textContent = t.__(
      'One row per reading: temperature, field and magnetisation. Readings at nearly the same temperature form one isotherm. The primary result is one fit of every point to the Arrott–Noakes equation of state; the other methods are cross-checks.'
    );
    const columns = this._row(t.__('Columns'));
    const labels: Record<IsothermRole, string> = { temperature: t.__('temperature'), field: t.__('field'), magnetisation: t.__('magnetisation') };
    for (const role of ROLES) {
      const select = document.createElement('select');
      select.className = `jp-mod-styled jp-psiscape-iso-${role}`;
      select.addEventListener('change', () => this._updateFieldUnit());
      this._pickers[role] = select;
      const unit = this._input(`jp-psiscape-iso-unit jp-psiscape-iso-${role}-unit`, t.__('unit from header'));
      unit.inputMode = 'text';
      unit.setAttribute('aria-label', t.__('unit of the %1 column', labels[role]));
      unit.addEventListener('input', () => this._updateFieldUnit());
      this._units[role] = unit;
      columns.appendChild(this._label(labels[role], select, unit));
    }

    const demagRow = this._row(t.__('Demagnetisation'));
    this._demag = this._input('jp-psiscape-iso-demag', t.__('unset'));
    this._convention = document.createElement('select');
    this._convention.className = 'jp-mod-styled jp-psiscape-iso-demag-convention';
    this._convention.setAttribute('aria-label', t.__('convention of N_d'));
    for (const [value, text] of [
      ['SI', t.__('SI (0–1)')],
      ['cgs', t.__('cgs (0–4π)')]
    ]) {
      const o = document.createElement('option');
      o.value = value;
      o.textContent = text;
      this._convention.appendChild(o);
    }
    this._shape = document.createElement('select');
    this._shape.className = 'jp-mod-styled jp-psiscape-iso-shape';
    const shapeNames: Record<string, string> = {
      sphere: t.__('sphere'),
      cube: t.__('cube'),
      'thin-plate-perpendicular': t.__('thin plate, field perpendicular'),
      'thin-plate-in-plane': t.__('thin plate, field in plane'),
      'long-needle-along': t.__('long needle, field along'),
      'long-cylinder-across': t.__('long cylinder, field across')
    };
    const custom = document.createElement('option');
    custom.value = '';
    custom.textContent = t.__('typed value');
    this._shape.appendChild(custom);
    for (const p of DEMAG_PRESETS) {
      const o = document.createElement('option');
      o.value = p.id;
      o.textContent = shapeNames[p.id];
      this._shape.appendChild(o);
    }
    const applyShape = (): void => {
      const v = demagPresetValue(this._shape.value, this._convention.value === 'cgs' ? 'cgs' : 'SI');
      if (v !== null) {
        this._demag.value = String(Number(v.toPrecision(6)));
      }
    };
    this._shape.addEventListener('change', applyShape);
    this._convention.addEventListener('change', applyShape);
    this._demag.addEventListener('input', () => (this._shape.value = ''));
    demagRow.append(this._label(t.__('N_d'), this._demag, this._convention), this._label(t.__('sample shape'), this._shape));
    const demagNote = document.createElement('p');
    demagNote.className = 'jp-psiscape-fit-convention';
    demagNote.textContent = t.__(
      'Without N_d the applied field is used: Tc and the exponents come out biased for any sample that is not a needle along the field. Shapes give the ellipsoid limits; a real plate or bar lies between them.'
    );

    const windowRow = this._row(t.__('Window'));
    this._fieldMin = this._input('jp-psiscape-iso-field-min', t.__('lowest'));
    this._fieldMax = this._input('jp-psiscape-iso-field-max', t.__('highest'));
    const unitMin = document.createElement('span');
    const unitMax = document.createElement('span');
    unitMin.className = unitMax.className = 'jp-psiscape-iso-range-unit';
    this._fieldUnitLabels = [unitMin, unitMax];
    this._tMax = this._input('jp-psiscape-iso-tmax', '0.1');
    windowRow.append(
      this._label(t.__('field from'), this._fieldMin, unitMin),
      this._label(t.__('field to'), this._fieldMax, unitMax),
      this._label(t.__('|t| up to'), this._tMax)
    );

    const sampleRow = this._row(t.__('Grouping and sample'));
    this._tolerance = this._input('jp-psiscape-iso-tolerance', '0.5');
    this._mass = this._input('jp-psiscape-iso-mass', '');
    this._density = this._input('jp-psiscape-iso-density', '');
    this._bootstrap = this._input('jp-psiscape-iso-bootstrap', t.__('none'));
    sampleRow.append(
      this._label(t.__('same isotherm within (K)'), this._tolerance),
      this._label(t.__('sample mass (mg)'), this._mass),
      this._label(t.__('density (g/cm³)'), this._density),
      this._label(t.__('bootstrap resamples'), this._bootstrap)
    );

    const actions = document.createElement('div');
    actions.className = 'jp-psiscape-fit-row jp-psiscape-iso-actions';
    this._run = document.createElement('button');
    this._run.type = 'button';
    this._run.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-iso-run';
    this._run.textContent = t.__('Analyse isotherms');
    this._run.addEventListener('click', onRun);
    this._cancel = document.createElement('button');
    this._cancel.type = 'button';
    this._cancel.className = 'jp-Button jp-mod-styled jp-mod-reject jp-psiscape-iso-cancel';
    this._cancel.textContent = t.__('Cancel');
    this._cancel.hidden = true;
    this._cancel.addEventListener('click', onCancel);
    actions.append(this._run, this._cancel);
    // Enter in any field runs the analysis.
    this.node.addEventListener('keydown', event => {
      if (event.key === 'Enter' && event.target instanceof HTMLInputElement && !this._run.disabled) {
        event.preventDefault();
        onRun();
      }
    });
    this.node.append(heading, intro, columns, demagRow, demagNote, windowRow, sampleRow, actions);
  }

  private _row(legend: string): HTMLFieldSetElement {
    const set = document.createElement('fieldset');
    set.className = 'jp-psiscape-fit-row jp-psiscape-iso-group';
    const l = document.createElement('legend');
    l.textContent = legend;
    set.appendChild(l);
    return set;
  }

  private _input(cls: string, placeholder: string): HTMLInputElement {
    const input = document.createElement('input');
    input.type = 'text';
    input.inputMode = 'decimal';
    input.className = `jp-mod-styled ${cls}`;
    input.placeholder = placeholder;
    return input;
  }

  private _label(text: string, ...controls: HTMLElement[]): HTMLLabelElement {
    const label = document.createElement('label');
    label.className = 'jp-psiscape-picker';
    const span = document.createElement('span');
    span.textContent = text;
    label.append(span, ...controls);
    return label;
  }

  private readonly _trans: TranslationBundle;
  private _table: ITable | null = null;
  private _pickers = {} as Record<IsothermRole, HTMLSelectElement>;
  private _units = {} as Record<IsothermRole, HTMLInputElement>;
  private _demag!: HTMLInputElement;
  private _convention!: HTMLSelectElement;
  private _shape!: HTMLSelectElement;
  private _fieldMin!: HTMLInputElement;
  private _fieldMax!: HTMLInputElement;
  private _fieldUnitLabels: HTMLSpanElement[] = [];
  private _tMax!: HTMLInputElement;
  private _tolerance!: HTMLInputElement;
  private _mass!: HTMLInputElement;
  private _density!: HTMLInputElement;
  private _bootstrap!: HTMLInputElement;
  private _run!: HTMLButtonElement;
  private _cancel!: HTMLButtonElement;
}
