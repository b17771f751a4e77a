/**
 * Reference curves of the reduced plot M/M0 against τ = T/Tc.
 */
import { describe, expect, it } from 'vitest';
import { ASYMPTOTIC_LAWS, reducedReferenceCurves } from '../../../src/core/physics/reference-curves';
import { UNIVERSALITY_CLASSES } from '../../../src/core/physics/universality';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { messageText } from '../../../src/core/messages';

const TAU = [0.5, 0.8, 0.9, 0.95, 0.99, 1.05];

describe('reducedReferenceCurves', () => {
  const curves = reducedReferenceCurves(TAU);
  const byId = (id: string) => curves.find(c => c.id === id)!;

  it('gives the exact 2D Ising magnetisation, checked against the closed form computed here', () => {
    // Onsager: kTc/J = 2/ln(1 + √2); Yang: M = (1 − sinh⁻⁴(2J/kT))^(1/8) [C1 in REFERENCES.md].
    const kTc = 2 / Math.log(1 + Math.SQRT2);
    const closed = (tau: number) => Math.pow(1 - Math.pow(Math.sinh(2 / (tau * kTc)), -4), 1 / 8);
    const c = byId('ising-2d');
    expect(c.m[1]).toBeCloseTo(closed(0.8), 13);
    expect(c.m[3]).toBeCloseTo(closed(0.95), 13);
    // Tabulated 40-digit values: M(T/Tc = 0.8) = 0.954410411907490, M(0.99) = 0.685860425733879 [C1].
    expect(c.m[1]).toBeCloseTo(0.95441041190749, 12);
    expect(c.m[4]).toBeCloseTo(0.685860425733879, 11);
    expect(c.m[5]).toBe(0);
    expect(c.citation).toMatch(/Onsager/);
  });

  it('gives the mean-field J = ½ curve of weissMagnetisation, m(0.9) = 0.5254295126580 [C3]', () => {
    const c = byId('weiss-0.5');
    expect(c.m).toEqual(Array.from(weissMagnetisation(0.5, TAU)));
    expect(c.m[2]).toBeCloseTo(0.525429512658, 11);
    expect(messageText(c.label)).toBe('Mean field, J = 1/2.');
    expect(curves.map(x => x.id)).toEqual(['weiss-0.5', 'weiss-1', 'weiss-3.5', 'weiss-inf', 'ising-2d', '3d-ising', '3d-xy', '3d-heisenberg']);
  });

  it('draws the 3D laws B(1 − τ)^β with β of the cited classes and B as cited', () => {
    for (const law of ASYMPTOTIC_LAWS) {
      const c = byId(law.classId);
      const beta = UNIVERSALITY_CLASSES.find(u => u.id === law.classId)!.beta.value;
      expect(c.law).toEqual({ B: law.B, beta, lattice: law.lattice, provenance: law.provenance });
      expect(c.m[0]).toBeCloseTo(law.B * Math.pow(0.5, beta), 14);
      expect(c.m[5]).toBe(0);
      expect(c.citation).toContain(law.amplitudeSource);
    }
    // 3D Ising: β = 0.32648 (Campostrini et al. 1999 [C2]); B = 1.6919045 on the simple-cubic lattice
    // (Talapov & Blöte 1996, from memory: unverified, and marked so in the curve's citation).
    expect(byId('3d-ising').law!.B).toBe(1.6919045);
    expect(byId('3d-ising').law!.beta).toBe(0.32648);
    expect(byId('3d-ising').citation).toMatch(/from memory/);
    // No amplitude at hand for XY and Heisenberg: shape only, and the label says so.
    expect(byId('3d-xy').law!.provenance).toBe('none');
    expect(messageText(byId('3d-heisenberg').label)).toMatch(/shape only/);
  });

  it('refuses τ ≤ 0', () => {
    expect(() => reducedReferenceCurves([0.5, 0])).toThrow(/τ/);
  });
});
