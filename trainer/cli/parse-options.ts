import { InvalidArgumentError } from "commander";

/** Parses an option value that must be a whole number >= 1. */
export function parsePositiveInteger(text: string): number {
  const value = Number(text);
  if (!Number.isSafeInteger(value) || value < 1) {
    throw new InvalidArgumentError(`expected a whole number >= 1, found "${text}"`);
  }
  return value;
}

/** Parses an option value that must be a whole number >= 0. */
export function parseNonNegativeInteger(text: string): number {
  const value = Number(text);
  if (!Number.isSafeInteger(value) || value < 0) {
    throw new InvalidArgumentError(`expected a whole number >= 0, found "${text}"`);
  }
  return value;
}

/** Parses one of a fixed set of words. */
export function parseChoice<T extends string>(choices: readonly T[]): (text: string) => T {
  return (text: string): T => {
    const found = choices.find((c) => c === text);
    if (found === undefined) {
      throw new InvalidArgumentError(`expected one of ${choices.join(", ")}, found "${text}"`);
    }
    return found;
  };
}
