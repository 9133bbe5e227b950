/**
 * The attrition allowance on a purchase quantity: parts lost to pick-and-place rejects, dropped
 * reels and rework, bought on top of what the boards need. Adding a percentage and rounding up is
 * common practice in electronics purchasing (a fact of the trade; the percentage is an organisation
 * setting, default 5 %).
 */

/** Default attrition allowance, percent. */
export const DEFAULT_ATTRITION_PERCENT = 5;

/** Largest allowance accepted, percent (beyond it the setting is surely a typing error). */
export const MAX_ATTRITION_PERCENT = 100;

/** Basis points per percent: the allowance is applied in whole basis points so no float rounding can add a part. */
const BASIS_POINTS_PER_PERCENT = 100;
const BASIS_POINTS_WHOLE = 100 * BASIS_POINTS_PER_PERCENT;

/**
 * Parts to buy for `shortQuantity` parts short with an allowance of `attritionPercent`:
 * `ceil(shortQuantity * (1 + attritionPercent / 100))`, computed in whole numbers
 * (`ceil(n * (10000 + bp) / 10000)` with the percentage in basis points, so 100 parts at 5 % is
 * exactly 105, where the float product 100 * 1.05 would round up to 106).
 * @param shortQuantity parts short, a whole number >= 0
 * @param attritionPercent allowance in percent, 0 to 100, at most two decimals count
 * @returns parts to buy, a whole number; 0 when nothing is short
 */
export function quantityWithAttrition(shortQuantity: number, attritionPercent = DEFAULT_ATTRITION_PERCENT): number {
  if (!Number.isSafeInteger(shortQuantity) || shortQuantity < 0) {
    throw new RangeError(`quantityWithAttrition: the short quantity must be a whole number >= 0, got ${shortQuantity}`);
  }
  if (!Number.isFinite(attritionPercent) || attritionPercent < 0 || attritionPercent > MAX_ATTRITION_PERCENT) {
    throw new RangeError(`quantityWithAttrition: the attrition allowance must be 0 to ${MAX_ATTRITION_PERCENT} %, got ${attritionPercent}`);
  }
  const basisPoints = Math.round(attritionPercent * BASIS_POINTS_PER_PERCENT);
  const scaled = shortQuantity * (BASIS_POINTS_WHOLE + basisPoints);
  return Math.floor((scaled + BASIS_POINTS_WHOLE - 1) / BASIS_POINTS_WHOLE);
}
