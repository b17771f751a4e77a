/**
 * Messages of the physics layer as thrown and returned: refusals of bad
 * input, conventions, notes and warnings of the fits, reasons of the
 * numerical transition search.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import {
  beanRodbellState,
  beanRodbellTransition,
  brillouinChecked,
  compareWithClasses,
  coupledPhases,
  deGennesTransition,
  effectiveExponentScan,
  effectiveMoment,
  fitBeanRodbell,
  fitCurieWeiss,
  fitLandau,
  fitPowerLaw,
  fitWeissIsotherms,
  fitWeissMT,
  fromConventionL,
  followPath,
  inverseBrillouin,
  ising2dMagnetisation,
  landauDerived,
  landauEquilibriumPsi,
  landauStationary,
  landauTransitionNumeric,
  linspace,
  meanFieldIsingTc,
  PhysicsInputError,
  referenceCurve,
  toConventionL,
  toDevonshire,
  weissCurieConstantSI,
  weissInverseIsotherm,
  weissMagnetisation
} from '../../../src/core/physics/index';
import type { ReferenceCurveKind } from '../../../src/core/physics/index';
import { expectGoodMessages, thrownMessage } from '../numeric/messageRules';

const SECOND = { a: 1, T0: 300, b: 2, c: 0.5, d: 0 };
const FIRST = { a: 1, T0: 300, b: -2, c: 1, d: 0 };

const bad: [string, () => unknown][] = [
  ['spin', () => weissMagnetisation(0.3, [0.5])],
  ['spin not positive', () => brillouinChecked(-1, 1)],
  ['brillouin NaN', () => brillouinChecked(1, NaN)],
  ['inverse brillouin', () => inverseBrillouin(1, 1.5)],
  ['tau', () => weissMagnetisation(0.5, [0.5, -1])],
  ['h', () => weissMagnetisation(0.5, [0.5], [Infinity])],
  ['tau/h lengths', () => weissMagnetisation(0.5, [0.5, 0.6], [0.1])],
  ['inverse isotherm tau', () => weissInverseIsotherm(0.5, 0, 0.1)],
  ['eta', () => beanRodbellState(0.5, -1, 1)],
  ['bean-rodbell tau', () => beanRodbellState(0.5, 1, 0)],
  ['bean-rodbell h', () => beanRodbellState(0.5, 1, 1, NaN)],
  ['bean-rodbell fit lengths', () => fitBeanRodbell({ T: [1, 2, 3, 4], M: [1, 1, 1] }, { J: 0.5, start: [1, 1, 0] })],
  ['bean-rodbell fit few', () => fitBeanRodbell({ T: [1, 2, 3], M: [1, 1, 1] }, { J: 0.5, start: [1, 1, 0] })],
  ['bean-rodbell fit T', () => fitBeanRodbell({ T: [1, 2, 3, -4], M: [1, 1, 1, 1] }, { J: 0.5, start: [1, 1, 0] })],
  ['bean-rodbell fit M', () => fitBeanRodbell({ T: [1, 2, 3, 4], M: [1, 1, 1, NaN] }, { J: 0.5, start: [1, 1, 0] })],
  ['coupled finite', () => coupledPhases({ a1: 1, a2: 1, b1: 1, b2: 1, T1: NaN, T2: 1, lambda: 0 }, 1)],
  ['coupled positive', () => coupledPhases({ a1: -1, a2: 1, b1: 1, b2: 1, T1: 1, T2: 1, lambda: 0 }, 1)],
  ['coupled unbounded', () => coupledPhases({ a1: 1, a2: 1, b1: 1, b2: 1, T1: 1, T2: 1, lambda: -2 }, 1)],
  ['curie constant', () => effectiveMoment(-1, 'SI')],
  ['ions', () => effectiveMoment(1, 'SI', 0)],
  ['curie-weiss lengths', () => fitCurieWeiss({ T: [1, 2, 3, 4], chi: [1, 2, 3] }, { units: 'SI' })],
  ['curie-weiss point', () => fitCurieWeiss({ T: [1, 2, 3, 4], chi: [1, 2, 3, NaN] }, { units: 'SI' })],
  ['curie-weiss few', () => fitCurieWeiss({ T: [1, 2, 3], chi: [1, 2, 3] }, { units: 'SI' })],
  ['curie-weiss few above', () => fitCurieWeiss({ T: [100, 200, 300, 400, 500], chi: [1, 2, 3, 4, 5] }, { units: 'SI', Tmin: 350 })],
  ['de gennes', () => deGennesTransition({ a: 0.1, B: -1, C: 2, Tstar: 300 })],
  ['de gennes finite', () => deGennesTransition({ a: 0.1, B: 1, C: 2, Tstar: NaN })],
  ['ising', () => ising2dMagnetisation(0)],
  ['ising z', () => meanFieldIsingTc(0)],
  ['reference tau', () => referenceCurve('weiss', [0])],
  ['reference kind', () => referenceCurve('nothing' as ReferenceCurveKind, [0.5])],
  ['weiss fit moment', () => fitWeissMT({ T: [1, 2, 3], M: [1, 1, 1] }, { J: 3.5, fieldTesla: 1 })],
  ['weiss fit few', () => fitWeissMT({ T: [1, 2], M: [1, 1] }, { J: 0.5 })],
  ['weiss fit T', () => fitWeissMT({ T: [1, 2, -3], M: [1, 1, 1] }, { J: 0.5 })],
  ['weiss fit M', () => fitWeissMT({ T: [1, 2, 3], M: [1, 1, NaN] }, { J: 0.5 })],
  ['weiss fit lengths', () => fitWeissMT({ T: [1, 2, 3], M: [1, 1] }, { J: 0.5 })],
  ['weiss isotherms B', () => fitWeissIsotherms({ T: [1, 2, 3], B: [1], M: [1, 1, 1] }, { J: 0.5, start: [1, 1, 1] })],
  ['weiss curie classical', () => weissCurieConstantSI(1, 2, Infinity)],
  ['power law lengths', () => fitPowerLaw({ T: [1, 2, 3, 4], y: [1, 2, 3] })],
  ['power law point', () => fitPowerLaw({ T: [1, 2, 3, 4], y: [1, 2, 3, NaN] })],
  ['power law proxy', () => fitPowerLaw({ T: [1, 2, 3, 4], y: [1, 2, 3, 4] }, { proxyPower: 0 })],
  ['power law wegner', () => fitPowerLaw({ T: [1, 2, 3, 4], y: [1, 2, 3, 4] }, { wegnerDelta: -1 })],
  ['window lengths', () => effectiveExponentScan({ T: [1, 2], y: [1] }, [0], [1])],
  ['landau a', () => landauStationary({ a: -1, b: 1, c: 1, T0: 0 }, 1)],
  ['landau unbounded', () => landauStationary({ a: 1, b: 1, c: -1, T0: 0 }, 1)],
  ['landau T0', () => landauStationary({ a: 1, b: 1, c: 1, T0: NaN }, 1)],
  ['landau closed forms', () => landauDerived({ ...FIRST, d: 1 })],
  ['landau devonshire', () => toDevonshire({ ...FIRST, d: 1 })],
  ['landau ginzburg', () => fromConventionL(FIRST, 'ginzburg-landau')],
  ['landau unknown', () => fromConventionL(FIRST, 'other' as 'L')],
  ['landau unknown input', () => toConventionL({ convention: 'other' } as unknown as Parameters<typeof toConventionL>[0])],
  ['landau curie', () => toConventionL({ convention: 'devonshire', coefficients: { curieConstant: -1, T0: 1, alpha11: 1, alpha111: 1 } })],
  ['landau fit lengths', () => fitLandau({ psi: { T: [1, 2, 3, 4], y: [1, 1, 1] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })],
  ['landau fit point', () => fitLandau({ psi: { T: [1, 2, 3, NaN], y: [1, 0, 0, 0] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })],
  ['landau fit sigma', () => fitLandau({ psi: { T: [1, 2, 3, 4], y: [1, 1, 1, 0] }, inverseChi: { T: [5, 6], y: [1, 2], sigma: [0.1, 0.1] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })],
  ['landau fit few', () => fitLandau({ psi: { T: [1, 2], y: [1, 0] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })],
  ['path lengths', () => followPath(FIRST, [1, 2], [0])],
  ['path point', () => followPath(FIRST, [1, NaN], [0, 0])],
  ['grid', () => linspace(0, 1, 1)]
];

describe('physics messages', () => {
  it('every refusal throws a PhysicsInputError with a good message', () => {
    const messages = bad.map(([what, fn]) => {
      const m = thrownMessage(fn, PhysicsInputError);
      expect(m.code, what).toMatch(/^physics\./);
      return m;
    });
    expect(expectGoodMessages(messages)).toBe(bad.length);
    expect(messageText(thrownMessage(() => weissMagnetisation(0.5, [0.5, -1]), PhysicsInputError))).toBe(
      'Point 2 has τ = −1: every reduced temperature must be a finite number above 0.'
    );
  });

  it('conventions, descriptions, notes, warnings and reasons of results are good', () => {
    const out: (ICoreMessage | null)[] = [];
    const T = linspace(150, 290, 40);
    const M = T.map(t => weissMagnetisation(0.5, [t / 300])[0]);
    const weiss = fitWeissMT({ T, M }, { J: 0.5, coarseAbove: 10, coarsePoints: 8 });
    out.push(weiss.convention, weiss.reason, ...weiss.warnings, ...weiss.notes);
    expect(weiss.notes.map(n => n.code)).toContain('physics.weiss.coarse-start');
    const Tcw = linspace(400, 800, 30);
    const cw = fitCurieWeiss({ T: Tcw, chi: Tcw.map(t => 0.001 + 3 / (t - 300)) }, { units: 'cgs-emu' });
    out.push(cw.convention, cw.reason, ...cw.warnings, effectiveMoment(3, 'SI').convention, effectiveMoment(3, 'cgs-emu').convention);
    const Tp = linspace(250, 299, 30);
    const pl = fitPowerLaw({ T: Tp, y: Tp.map(t => 2 * Math.pow(1 - t / 300, 0.33)) }, { proxyPower: 2 });
    out.push(pl.convention, pl.reason, ...pl.warnings);
    const scan = effectiveExponentScan({ T: Tp, y: Tp.map(t => 2 * Math.pow(1 - t / 300, 0.33)) }, [0, 0.15], [0.05, 0.2], { minPoints: 6 });
    out.push(scan.convention, ...scan.cells.map(c => c.reason));
    expect(scan.cells.some(c => c.reason.code === 'physics.window.too-few-points')).toBe(true);
    const Tl = linspace(200, 299, 30);
    const landau = fitLandau({ psi: { T: Tl, y: Tl.map(t => landauEquilibriumPsi(SECOND, t)) } }, { start: { a: 1, T0: 295, b: 1.5, c: 0.4 }, reportIn: 'ginzburg-landau' });
    out.push(landau.reason, ...landau.warnings, ...landau.notes);
    for (const kind of ['weiss', 'landau-mean-field', 'tricritical', 'ising-2d'] as const) {
      out.push(referenceCurve(kind, [0.5, 0.9]).description);
    }
    out.push(compareWithClasses({ beta: { value: 0.33, error: 0.01 } }).warning);
    out.push(landauTransitionNumeric(FIRST).reason, landauTransitionNumeric(SECOND).reason, landauTransitionNumeric({ ...FIRST, d: -1 }).reason);
    out.push(beanRodbellTransition(0.5, 0.5).convention, beanRodbellTransition(0.5, 2).convention);
    out.push(deGennesTransition({ a: 0.1, B: 1, C: 2, Tstar: 300 }).convention);
    out.push(coupledPhases({ a1: 1, a2: 1, b1: 1, b2: 1, T1: 2, T2: 1, lambda: 0.5 }, 1).convention);
    const Tb = linspace(100, 290, 12);
    const br = fitBeanRodbell({ T: Tb, M: Tb.map(t => 2 * weissMagnetisation(0.5, [t / 300])[0]) }, { J: 0.5, start: [2, 300, 0], fixEta: true });
    out.push(br.convention, br.reason, ...br.warnings, ...br.notes);
    expect(expectGoodMessages(out)).toBeGreaterThan(30);
  });
});
