/**
 * One item to score: feature name to value. Numeric features take a number (NaN,
 * null or absent: missing); categorical features take a string (a number is read
 * as its text; null or absent: missing). Other keys are ignored.
 *
 * @example
 * const item: ScoreItem = { tie_strength: 0.4, crop: "kale", plot_zone: null };
 */
export type ScoreItem = Readonly<Record<string, number | string | null | undefined>>;
