/**
 * psiscape's own notebook output read as untrusted data: the payload
 * validates against schema/analysis-output.v1.json when psiscape wrote it;
 * malformed or hostile payloads (wrong types, script in strings, huge
 * arrays) are refused with a message or drawn as plain text, never run.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { nullTranslator } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { buildReport, notebookOutputs, runAnalysisJobForTest } from './inline-fixtures';
import { readPayload, renderInlineAnalysis } from '../../src/ui/inline-analysis';

const schemaDir = path.resolve(__dirname, '../../schema');
const load = (f: string) => JSON.parse(fs.readFileSync(path.join(schemaDir, f), 'utf8'));
const ajv = new Ajv({ allErrors: true, strict: false });
ajv.addSchema(load('saved-analyses.v2.json'));
ajv.addSchema(load('analysis-result.v1.json'));
const validateOutput = ajv.compile(load('analysis-output.v1.json'));

function outputs(header = 'M (emu/g)') {
  const { outcome, saved } = runAnalysisJobForTest(header);
  const report = buildReport(outcome, { psiscapeVersion: '1.0.0', source: saved.source, columns: { x: { header: 'T (K)', unit: 'K' }, y: { header, unit: null }, sigma: null } });
  return notebookOutputs({ report, png: 'iVBORw0KGgo=', pngScale: 2, width: 400, height: 300, svg: '<svg/>', spec: {}, analysis: saved });
}

const MIME = 'application/vnd.psiscape.analysis.v1+json';

describe('psiscape notebook output', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('validates against schema/analysis-output.v1.json, both parts', () => {
    for (const o of outputs()) {
      const ok = validateOutput(JSON.parse(JSON.stringify(o.data[MIME])));
      expect(validateOutput.errors ?? []).toEqual([]);
      expect(ok).toBe(true);
    }
  });

  it('reads the analysis part back through the saved-format reader', () => {
    const read = readPayload(outputs()[1].data[MIME]);
    expect('part' in read && read.part).toBe('analysis');
  });

  it('refuses payloads of another format or version, and malformed analyses, with a message', () => {
    for (const bad of [null, 42, 'text', [], { format: 'other', version: 1 }, { format: 'psiscape-analysis', version: 2 }, { format: 'psiscape-analysis', version: 1, part: 'analysis', analysis: { id: 7 } }]) {
      const read = readPayload(bad);
      expect('problem' in read).toBe(true);
    }
  });

  it('refuses an analysis with a million-entry snapshot column of the wrong type without drawing it', () => {
    const o = outputs()[1].data[MIME] as { analysis: { snapshot: { values: unknown[][] } } };
    const huge = structuredClone(o);
    huge.analysis.snapshot.values[0] = new Array(1_000_000).fill('x');
    expect('problem' in readPayload(huge)).toBe(true);
  });

  it('draws hostile text as text: no element or script comes from the payload', async () => {
    const host = new Panel();
    Widget.attach(host, document.body);
    const hostile = '<img src=x onerror="window.__pwned=1"><script>window.__pwned=2</script>';
    renderInlineAnalysis(host, outputs(hostile)[1].data[MIME], nullTranslator);
    await new Promise(resolve => setTimeout(resolve, 50));
    expect(host.node.querySelector('img')).toBeNull();
    expect(host.node.querySelector('script')).toBeNull();
    expect((window as unknown as { __pwned?: number }).__pwned).toBeUndefined();
    expect(host.node.textContent).toContain('onerror');
    host.dispose();
  });

  it('shows a one-line note for the chart part and a message for an unreadable payload', () => {
    const host = new Panel();
    Widget.attach(host, document.body);
    renderInlineAnalysis(host, outputs()[0].data[MIME], nullTranslator);
    expect(host.node.textContent).toMatch(/live in the next output/);
    renderInlineAnalysis(host, { format: 'psiscape-analysis', version: 1, part: 'analysis', analysis: 'nope' }, nullTranslator);
    expect(host.node.textContent).toMatch(/could not be read/);
    host.dispose();
  });
});
