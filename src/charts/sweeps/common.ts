/**
 * Shared pieces of the sweep chart builders: what a builder returns and the
 * test for numbers placed in data rows. The frame is `../frame.ts`.
 */
import type { TopLevelSpec } from 'vega-lite';

/** A spec with how many rows it plots. */
export interface ISweepChart {
  spec: TopLevelSpec;
  /** Number of data rows over all layers. */
  rows: number;
}

/** True for a finite number. */
export function finite(v: number): boolean {
  return typeof v === 'number' && Number.isFinite(v);
}
