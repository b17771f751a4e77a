/**
 * The parts of mathjs psiscape uses, built from their factories: the
 * expression parser with its node classes and the functions models may call
 * (src/core/expr), and units (src/core/units makes its own instance with
 * unitMathFactories). Bundling these instead of mathjs's complete default
 * instance about halves the mathjs code shipped with the analysis (354 kB
 * instead of 686 kB minified, 99 kB instead of 196 kB gzip, measured with
 * esbuild).
 *
 * Type guards (isSymbolNode, …) are plain functions: import them from
 * 'mathjs' directly; they pull in no instance.
 */
import { create, createUnitDependencies, unitDependencies } from 'mathjs';
import * as parserFactories from './mathjs-factories';
import type * as M from 'mathjs';

/** Factories of the unit functions (for an instance that adds its own units). */
export const unitMathFactories = { unitDependencies, createUnitDependencies };

/**
 * The parser's instance also holds every function and operator a model
 * expression may use (mathjs-factories.ts), so that mathjs's own evaluation
 * of a parsed node (the fallback path and the tests' reference) works. A test
 * checks the lists agree.
 */
const parser = create(parserFactories, {});

/** mathjs's expression parser (an instance of our own; no global state). */
export const parse: M.ParseFunction = parser.parse;

/* The node classes of that parser, as values (constructors) and types. */
export const ConditionalNode = parser.ConditionalNode;
export type ConditionalNode = M.ConditionalNode;
export const ConstantNode = parser.ConstantNode;
export type ConstantNode = M.ConstantNode;
export const FunctionNode = parser.FunctionNode;
export type FunctionNode = M.FunctionNode;
export const OperatorNode = parser.OperatorNode;
export type OperatorNode = M.OperatorNode;
export const SymbolNode = parser.SymbolNode;
export type SymbolNode = M.SymbolNode;
