/**
 * Bean–Rodbell magnetovolume model [B11 in REFERENCES.md] in reduced units,
 * σ = M/Ms, τ′ = T/T0, h = g μB J B_a/(kB T0):
 *   G/(N kB T0) = −(k/2)σ² − (k κ_J η/4)σ⁴ − h σ − τ′ S_J(σ)/(N kB)
 *   σ = B_J(x),  x = k[σ + κ_J η σ³]/τ′ + h/τ′,   k = 3J/(J+1),
 *   κ_J = (3/10)((J+1)² + J²)/(J+1)².
 * η < 1 second order, η = 1 tricritical, η > 1 first order (Tc > T0).
 * The equilibrium is the global minimum of G over all self-consistent roots.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { bracketRoot } from '../numeric/scalar';
import { brillouin, inverseBrillouin, weissCoupling } from './brillouin';
import { PhysicsInputError, requireFinite, requireSpin } from './errors';

/** κ_J (1/3 for J = ½, 3/10 for J → ∞). */
export function beanRodbellKappa(J: number): number {
  return J === Infinity ? 0.3 : (0.3 * ((J + 1) * (J + 1) + J * J)) / ((J + 1) * (J + 1));
}

/** ln(sinh u / u), stable for all u ≥ 0. */
function lnSinhc(u: number): number {
  if (u < 1e-3) {
    const u2 = u * u;
    return u2 / 6 - (u2 * u2) / 180;
  }
  return u + Math.log1p(-Math.exp(-2 * u)) - Math.LN2 - Math.log(u);
}

/** Entropy of free moments S_J(σ)/(N kB) up to a constant: ln Z(y) − yσ, y = B_J⁻¹(σ). */
export function spinEntropy(J: number, sigma: number): number {
  const s = Math.abs(sigma);
  if (s >= 1) {
    return -Infinity;
  }
  const y = inverseBrillouin(J, s);
  if (J === Infinity) {
    return lnSinhc(y) - y * s;
  }
  const a = (2 * J + 1) / (2 * J);
  const b = 1 / (2 * J);
  return lnSinhc(a * y) - lnSinhc(b * y) - y * s;
}

/** Reduced Gibbs energy G/(N kB T0) at σ. */
export function beanRodbellG(J: number, eta: number, tau: number, h: number, sigma: number): number {
  const k = weissCoupling(J);
  const kap = beanRodbellKappa(J);
  const s2 = sigma * sigma;
  return -(k / 2) * s2 - ((k * kap * eta) / 4) * s2 * s2 - h * sigma - tau * spinEntropy(J, sigma);
}

/** All self-consistent σ and the equilibrium at one (τ′, h). */
export interface IBeanRodbellState {
  roots: { sigma: number; G: number }[];
  sigma: number;
  G: number;
}

/** Finds every self-consistent root on a fine grid in σ, then the global minimum of G. */
export function beanRodbellState(J: number, eta: number, tau: number, h = 0): IBeanRodbellState {
  requireSpin(J);
  requireFinite('eta', eta);
  requireFinite('h', h);
  if (!(eta >= 0)) {
    throw new PhysicsInputError(msg('physics.eta-negative', 'η must be at least 0, but it is %1.', eta));
  }
  if (!(tau > 0)) {
    throw new PhysicsInputError(msg('physics.tau-not-positive', 'The reduced temperature τ must be above 0, but it is %1.', tau));
  }
  const k = weissCoupling(J);
  const kap = beanRodbellKappa(J);
  const sgn = h < 0 ? -1 : 1;
  const hh = Math.abs(h);
  const g = (s: number): number => s - brillouin(J, (k * (s + kap * eta * s * s * s) + hh) / tau);
  // grid: geometric near 0 plus uniform, over (0, 1)
  const grid: number[] = [];
  for (let e = -12; e < -2; e += 0.05) {
    grid.push(Math.pow(10, e));
  }
  for (let i = 1; i < 2000; i++) {
    grid.push(0.01 + (0.99 * i) / 2000);
  }
  grid.push(1 - 1e-12);
  const roots: { sigma: number; G: number }[] = [];
  if (hh === 0) {
    roots.push({ sigma: 0, G: beanRodbellG(J, eta, tau, 0, 0) });
  }
  let prevS = hh === 0 ? grid[0] : 0;
  let prevG = g(prevS);
  for (const s of hh === 0 ? grid.slice(1) : grid) {
    const gs = g(s);
    if (prevG === 0) {
      roots.push({ sigma: prevS, G: beanRodbellG(J, eta, tau, hh, prevS) });
    } else if (prevG * gs < 0) {
      const r = bracketRoot(g, prevS, s, 1e-16);
      roots.push({ sigma: r.root, G: beanRodbellG(J, eta, tau, hh, r.root) });
    }
    prevS = s;
    prevG = gs;
  }
  let best = roots[0];
  for (const r of roots) {
    if (best === undefined || r.G < best.G) {
      best = r;
    }
  }
  const out = roots.map(r => ({ sigma: sgn * r.sigma, G: r.G }));
  return { roots: out, sigma: sgn * best.sigma, G: best.G };
}

/** Equilibrium σ(τ′) over an array at field h. */
export function beanRodbellMagnetisation(J: number, eta: number, tau: ArrayLike<number>, h = 0): Float64Array {
  const out = new Float64Array(tau.length);
  for (let i = 0; i < tau.length; i++) {
    out[i] = beanRodbellState(J, eta, tau[i], h).sigma;
  }
  return out;
}

/** Transition of the Bean–Rodbell model at h = 0. */
export interface IBeanRodbellTransition {
  /** The reduced variables, for people (code `physics.bean-rodbell.reduced`). */
  convention: ICoreMessage;
  firstOrder: boolean;
  /** Tc/T0. */
  tauC: number;
  /** Jump of σ at Tc (0 when continuous). */
  sigmaJump: number;
  converged: boolean;
}

/** Tc/T0 and the σ jump: = 1 for η ≤ 1; for η > 1 from G_ordered(τ) = G(0). */
export function beanRodbellTransition(J: number, eta: number): IBeanRodbellTransition {
  const convention = msg('physics.bean-rodbell.reduced', 'Bean–Rodbell model in reduced variables: τ = T/T0, σ = M/Ms.');
  if (!(eta > 1)) {
    beanRodbellState(J, eta, 1); // validates
    return { convention, firstOrder: false, tauC: 1, sigmaJump: 0, converged: true };
  }
  const dG = (tau: number): number => {
    const st = beanRodbellState(J, eta, tau);
    let ord = Infinity;
    for (const r of st.roots) {
      if (r.sigma > 1e-6) {
        ord = Math.min(ord, r.G);
      }
    }
    return ord - beanRodbellG(J, eta, tau, 0, 0);
  };
  let hi = 1.01;
  while (Number.isFinite(dG(hi)) && dG(hi) < 0 && hi < 100) {
    hi = 1 + 2 * (hi - 1);
  }
  // shrink from above until an ordered root exists
  let lo = 1;
  let top = hi;
  if (!Number.isFinite(dG(top))) {
    for (let i = 0; i < 80; i++) {
      const mid = 0.5 * (lo + top);
      if (Number.isFinite(dG(mid)) && dG(mid) < 0) {
        lo = mid;
      } else if (Number.isFinite(dG(mid))) {
        top = mid;
        break;
      } else {
        top = mid;
      }
    }
  }
  const r = bracketRoot(dG, lo, top, 1e-14);
  const st = beanRodbellState(J, eta, r.root);
  let jump = 0;
  let bestG = Infinity;
  for (const x of st.roots) {
    if (x.sigma > 1e-6 && x.G < bestG) {
      bestG = x.G;
      jump = x.sigma;
    }
  }
  return { convention, firstOrder: true, tauC: r.root, sigmaJump: jump, converged: r.converged };
}
