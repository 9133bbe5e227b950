/**
 * A saved match as the build and shortfall calculations see it: its ports and frequency, and each
 * element with the parts it is built from, in ladder order (source to load). Evaluated with the
 * engine's own part models, ABCD ladder and losses (rf-engine.md), at f0 only.
 */
import type { Complex } from '../engine/complex.js';
import { type FitLosses, fitLosses } from '../engine/losses.js';
import { createLadder } from '../engine/ladder.js';
import type { Arrangement, PartKind, Position } from '../engine/part-kind.js';
import { type ElementModel, elementModel, partModel, type PartSpec } from '../engine/part-model.js';
import { constantPort } from '../engine/port-model.js';
import type { Tolerance } from '../engine/tolerance-codes.js';

/** One element of a match design. */
export interface DesignElement {
  position: Position;
  kind: PartKind;
  /** The ideal element value at f0, F or H. */
  idealValue: number;
  arrangement: Arrangement;
  /** Every physical part of the element (one, or two for series and parallel). */
  parts: PartSpec[];
}

/** A match design: ports at f0 and the elements, source to load. */
export interface MatchDesign {
  /** Source impedance at f0, ohm. */
  source: Complex;
  /** Load impedance at f0, ohm. */
  load: Complex;
  frequencyHz: number;
  elements: DesignElement[];
}

/** A part to buy at a standard value, modelled as ideal: exact value, no parasitics, lossless. */
export function boughtPartSpec(kind: PartKind, valueSi: number, tolerance: Tolerance): PartSpec {
  return { kind, valueSi, tolerance };
}

/** What to evaluate in place of some elements: element index to its replacement parts (a single part each). */
export type ElementReplacements = ReadonlyMap<number, PartSpec>;

/** The design's elements as engine models, with `replacements` put in as single parts. */
export function designElementModels(design: MatchDesign, replacements: ElementReplacements = new Map()): ElementModel[] {
  return design.elements.map((element, index) => {
    const replacement = replacements.get(index);
    if (replacement) return elementModel(element.position, 'single', [partModel(replacement, `elements.${index}.replacement`)]);
    return elementModel(
      element.position,
      element.arrangement,
      element.parts.map((spec, i) => partModel(spec, `elements.${index}.parts.${i}`)),
      `elements.${index}`,
    );
  });
}

/**
 * The losses of the design at f0 (rf-engine.md "Losses of a fit": value error, total, worst case
 * over all tolerance corners), with some elements replaced. Ports are taken as their impedance at
 * f0 (at f0 every port model gives it), so only f0 is evaluated.
 */
export function designLosses(design: MatchDesign, replacements: ElementReplacements = new Map()): FitLosses {
  const ladder = createLadder(designElementModels(design, replacements));
  return fitLosses(ladder, constantPort(design.source, 'source'), constantPort(design.load, 'load'), design.frequencyHz);
}
