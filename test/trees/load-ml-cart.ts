/**
 * ml-cart (an independent CART implementation from npm) ships no type
 * declarations; this loads it through a computed specifier and states the small
 * part of its API the tests use.
 */
export interface MlCartRegression {
  train(x: number[][], y: number[]): void;
  predict(x: number[][]): number[];
  root: { splitColumn: number; splitValue: number };
}

export interface MlCart {
  DecisionTreeRegression: new (options: {
    maxDepth?: number;
    minNumSamples?: number;
  }) => MlCartRegression;
}

export async function loadMlCart(): Promise<MlCart> {
  const specifier: string = "ml-cart";
  return (await import(specifier)) as MlCart;
}
