/**
 * The JSON Schema (draft-07) of the saved format, version 2. The file
 * `schema/saved-analyses.v2.json` is this object written out for other tools;
 * a test keeps the two equal.
 *
 * Every object allows fields the schema does not list, so a newer writer's
 * additions stay valid (and psiscape keeps them when it saves). What JSON
 * Schema cannot say is checked in code and stated in the descriptions: the
 * value columns of a snapshot have one length, and headers, units and columns
 * are as many.
 */

/** `$id` of the schema. */
export const SAVED_SCHEMA_ID = 'urn:psiscape:saved-analyses:2';

const headerProperty = { type: 'string', description: 'Header of the column in the source table.' } as const;

const columnRefProperties = {
  index: {
    type: 'integer',
    minimum: -1,
    description: 'Position of the column in the source table, from 0. -1 (only in entries migrated from format 1, which saved headers alone): the first column with this header.'
  },
  header: headerProperty
};

/** A column of the isotherm analysis, by position and header. */
const isothermColumn = {
  type: 'object',
  required: ['index', 'header'],
  properties: {
    index: { type: 'integer', minimum: 0, description: 'Position of the column in the source table, from 0.' },
    header: headerProperty
  }
} as const;

/** A control's text as the user typed it, or null when left blank. */
const typedText = { type: ['string', 'null'], maxLength: 200 } as const;

/** The schema object. */
export const SAVED_SCHEMA = {
  $schema: 'http://json-schema.org/draft-07/schema#',
  $id: SAVED_SCHEMA_ID,
  title: 'psiscape saved analyses, format version 2',
  description:
    'The value of the notebook metadata key "psiscape". Readers check each entry of "analyses" on its own: an entry that does not match is kept in the notebook unchanged and not opened. Fields not listed here are allowed everywhere and are kept when psiscape saves.',
  type: 'object',
  required: ['version', 'analyses'],
  properties: {
    version: { const: 2, description: 'Format version. A block with a higher version is left unchanged by psiscape versions that do not know it.' },
    analyses: { type: 'array', items: { $ref: '#/definitions/analysis' } },
    explorers: {
      type: 'array',
      description: 'Landau explorers opened from this notebook (optional). Readers check each entry on its own, like analyses.',
      items: { $ref: '#/definitions/explorer' }
    }
  },
  definitions: {
    explorer: {
      type: 'object',
      description: 'One Landau free-energy explorer: the coefficients it shows (convention L: F = (a/2)(T − T0)ψ² + (d/3)ψ³ + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ), the convention they are displayed in, and the temperature and field of its landscape.',
      required: ['id', 'coefficients', 'convention', 'T', 'h'],
      properties: {
        id: { type: 'string', minLength: 1, description: 'Identifier, unique among the explorers of the notebook.' },
        coefficients: {
          type: 'object',
          required: ['a', 'T0', 'b', 'c'],
          properties: {
            a: { type: 'number' },
            T0: { type: 'number' },
            b: { type: 'number' },
            c: { type: 'number' },
            d: { type: 'number', description: 'Cubic coefficient; 0 when absent.' }
          }
        },
        convention: {
          type: 'string',
          description: 'Convention the coefficients are displayed in: "L", "no-fractions", "devonshire" or "ginzburg-landau". Readers show an unknown one as "L".'
        },
        T: { type: 'number', description: 'Temperature of the landscape.' },
        h: { type: 'number', description: 'Conjugate field h.' },
        preset: {
          type: 'string',
          description: 'Optional. The preset the free energy was set from: "bean-rodbell", "devonshire" or "de-gennes"; readers ignore an unknown one.'
        },
        presetValues: {
          type: 'object',
          description: 'Optional. The preset\'s own parameters by name (e.g. eta and T0 of Bean–Rodbell).',
          additionalProperties: { type: 'number' }
        },
        typed: {
          type: 'object',
          description: 'Optional. A free energy typed by the user in ψ (or psi), T, h and named coefficients, with the coefficients\' values; when present it is the free energy shown.',
          required: ['text', 'values'],
          properties: {
            text: { type: 'string' },
            values: { type: 'object', additionalProperties: { type: 'number' } }
          }
        },
        coupled: {
          type: 'object',
          description: 'Optional. Coefficients of the two-order-parameter landscape F(ψ, φ) = (a1/2)(T − T1)ψ² + (b1/4)ψ⁴ + (a2/2)(T − T2)φ² + (b2/4)φ⁴ + (λ/2)ψ²φ².',
          required: ['a1', 'T1', 'b1', 'a2', 'T2', 'b2', 'lambda'],
          additionalProperties: { type: 'number' }
        },
        view: {
          type: 'string',
          description: 'Optional. The chart tab shown: "landscape" (the landscape and the branches), "phase-diagram", "landscape-2d" or "loop"; "branches", written before the branches joined the landscape\'s tab, shows that tab; readers show the landscape for an unknown one.'
        },
        overlay: {
          type: 'object',
          description: 'Optional. The measured points (at most 2000) and the fitted curve (at most 400 points) of the fit the explorer was opened from, drawn over its branches; longer series are thinned to every k-th point. Each is two columns of equal length. Readers ignore a malformed one.',
          required: ['data', 'fitted'],
          properties: {
            data: { $ref: '#/definitions/overlayColumns' },
            fitted: { $ref: '#/definitions/overlayColumns' }
          }
        }
      }
    },
    overlayColumns: {
      type: 'object',
      description: 'Points as a temperature column T and an order-parameter column psi of equal length.',
      required: ['T', 'psi'],
      properties: {
        T: { type: 'array', items: { type: 'number' } },
        psi: { type: 'array', items: { type: 'number' } }
      }
    },
    analysis: {
      type: 'object',
      description: 'One saved analysis: where its table came from, which columns it plots, a snapshot of them and the settings of its last run.',
      required: ['id', 'source', 'columns', 'snapshot', 'settings'],
      properties: {
        id: { type: 'string', minLength: 1, description: 'Identifier, unique within the notebook.' },
        source: {
          type: 'object',
          description: 'The notebook output the table was read from.',
          required: ['notebookPath', 'cellId', 'outputIndex', 'contentHash'],
          properties: {
            notebookPath: { type: 'string', description: 'Notebook path relative to the contents root, when the analysis was saved.' },
            cellId: { type: 'string', description: 'nbformat id of the cell.' },
            outputIndex: { type: 'integer', minimum: 0, description: 'Position of the output among the cell outputs, from 0.' },
            contentHash: { type: 'string', description: 'Hash of the output MIME bundle when last read, to notice changes.' }
          }
        },
        columns: {
          type: 'object',
          description: 'The plotted columns of the source table.',
          required: ['x', 'y', 'sigma'],
          properties: {
            x: { type: 'object', required: ['index', 'header'], properties: columnRefProperties },
            y: { type: 'object', required: ['index', 'header'], properties: columnRefProperties },
            sigma: {
              type: ['object', 'null'],
              description: 'The column of standard deviations of y, or null.',
              required: ['index', 'header'],
              properties: columnRefProperties
            }
          }
        },
        snapshot: {
          type: 'object',
          description:
            'The plotted columns (x, y, then sigma when picked) as last seen, shown when the source output is gone. headers, units and values have one item per column; all value columns have the same length. A table above 20000 cells (rows x columns) is not copied: then "omitted" is true, "values" is absent, and "rows" and "hash" identify the data; the analysis keeps a reference (its source) and the hash.',
          required: ['headers', 'units'],
          properties: {
            headers: { type: 'array', items: { type: 'string' } },
            units: { type: 'array', items: { type: ['string', 'null'] } },
            values: {
              type: 'array',
              description: 'One array per column; null for a missing or non-finite value.',
              items: { type: 'array', items: { type: ['number', 'null'] } }
            },
            rows: { type: 'integer', minimum: 0, description: 'Row count (omitted snapshots).' },
            hash: {
              type: 'string',
              pattern: '^[0-9a-f]{16}$',
              description:
                'Omitted snapshots: two 32-bit FNV-1a hashes (prime 16777619, offset bases 2166136261 and 84696351), 8 lowercase hex digits each, of the values column after column, each as IEEE-754 binary64 little-endian bytes, a missing value as the bytes of 0x7ff8000000000000.'
            },
            omitted: { const: true, description: 'Present (true) when the values were not copied.' }
          },
          if: { properties: { omitted: { const: true } }, required: ['omitted'] },
          then: { required: ['rows', 'hash'] },
          else: { required: ['values'] }
        },
        settings: {
          type: ['object', 'null'],
          description: 'The settings of the last analysis run, or null when none was run.',
          required: ['kind', 'options', 'window'],
          properties: {
            kind: { type: 'string', minLength: 1, description: 'Analysis kind id (e.g. "power-law", "weiss", "expression"). Entries of a kind a reader does not know are kept and not opened.' },
            options: {
              type: 'object',
              description: 'Options of the kind by name. Infinite numbers are written as the strings "inf" and "-inf".',
              additionalProperties: { type: ['string', 'number', 'boolean'] }
            },
            window: {
              type: 'object',
              description: 'The fit window in units of the x column; null is an open end.',
              required: ['min', 'max'],
              properties: { min: { type: ['number', 'null'] }, max: { type: ['number', 'null'] } }
            },
            weights: {
              type: 'object',
              description: 'How points were weighted, when not the default (the σ column when there is one, else equal weights).',
              required: ['mode', 'fraction'],
              properties: {
                mode: { type: 'string', enum: ['sigma', 'relative', 'equal'] },
                fraction: { type: ['number', 'null'], exclusiveMinimum: 0, description: 'Relative weights: σ_i = fraction·|y_i|; null: estimated from the residuals.' }
              }
            }
          }
        },
        isotherms: {
          type: 'object',
          description:
            'The isotherm (field-sweep) analysis of the same table, when one was run: its three columns and its controls as the user typed them (text; null when left blank).',
          required: ['columns', 'units', 'demagnetisingFactorSI', 'temperatureToleranceK', 'sampleMassMg', 'densityGPerCm3'],
          properties: {
            columns: {
              type: 'object',
              required: ['temperature', 'field', 'magnetisation'],
              properties: { temperature: isothermColumn, field: isothermColumn, magnetisation: isothermColumn }
            },
            units: {
              type: 'object',
              description: "Units typed over the headers' own.",
              required: ['temperature', 'field', 'magnetisation'],
              properties: { temperature: typedText, field: typedText, magnetisation: typedText }
            },
            demagnetisingFactorSI: { ...typedText, description: 'Demagnetising factor N_d, SI convention (0–1).' },
            temperatureToleranceK: { ...typedText, description: 'Readings within this many kelvin form one isotherm.' },
            sampleMassMg: { ...typedText, description: 'Sample mass in mg.' },
            densityGPerCm3: { ...typedText, description: 'Density in g/cm³.' },
            demagnetisingConvention: { type: 'string', enum: ['SI', 'cgs'], description: 'Convention N_d was typed in; absent means SI.' },
            demagnetisingFactorCgs: { ...typedText, description: 'Demagnetising factor N_d, cgs convention (0–4π), when that convention was chosen.' },
            sampleShape: { ...typedText, description: 'Sample-shape preset chosen for N_d.' },
            fieldMin: { ...typedText, description: "Lowest field used, in the field column's unit." },
            fieldMax: { ...typedText, description: "Highest field used, in the field column's unit." },
            tMax: { ...typedText, description: 'Largest |t| = |T − Tc|/Tc of the exponent fits.' },
            bootstrapSamples: { ...typedText, description: 'Bootstrap resamples over isotherms.' },
            view: { ...typedText, description: 'The view of the isotherm analysis shown.' }
          }
        }
      }
    }
  }
} as const;
