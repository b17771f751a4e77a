/**
 * The 1/χ view (real Lumino widget in jsdom): a Curie–Weiss fit of
 * χ = C/(T − θ) is drawn as 1/χ against T with the fitted law, θ stated in
 * words; other outcomes clear it.
 */
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { InverseChiView } from '../../../src/ui/temperature';
import { CURIE, curieWeissCsv, fitted, sessionFor, theme, trans, weissCsv } from './helpers';

function open(csv: string, kind: string) {
  const session = sessionFor(csv, kind);
  const view = new InverseChiView({ trans, session, theme });
  Widget.attach(view, document.body);
  const p = session.plotted()!;
  return { session, view, points: { x: p.x.column.values as Float64Array, y: p.y.column.values as Float64Array } };
}

const status = (view: InverseChiView) => view.node.querySelector('.jp-psiscape-inverse-chi-status')!.textContent!;

describe('InverseChiView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should draw 1/χ against T with the fitted law and state θ', async () => {
    const { session, view, points } = open(curieWeissCsv(), 'curie-weiss');
    const outcome = await fitted(session);
    await view.update(outcome, points);
    // χ = C/(T − θ) with θ = 40 K (REFERENCE.md B2): 1/χ = (T − θ)/C crosses zero at θ; the 0.1 % wiggle moves θ by well under 1 K.
    const theta = outcome.fit.values[outcome.fit.parameters.indexOf('theta')];
    expect(Math.abs(theta - CURIE.theta)).toBeLessThan(1);
    expect(status(view)).toMatch(/^θ = (39|40)\.\d+ ± \d/);
    expect(view.chart.spec).not.toBeNull();
    expect(JSON.stringify(view.chart.spec)).not.toMatch(/NaN/);
    expect(view.chart.node.querySelector('svg, canvas')).not.toBeNull();
    expect(view.node.querySelector('.jp-psiscape-inverse-chi-caption')!.textContent).toMatch(/C = 1\.\d+ ± /);
  });

  it('should clear itself for an outcome that is not Curie–Weiss', async () => {
    const { session, view, points } = open(curieWeissCsv(), 'curie-weiss');
    await view.update(await fitted(session), points);
    const other = open(weissCsv(), 'weiss');
    await view.update(await fitted(other.session), other.points);
    expect(view.chart.spec).toBeNull();
    expect(view.chart.isHidden).toBe(true);
    expect(status(view)).toMatch(/Fit a Curie–Weiss law/);
  });
});
