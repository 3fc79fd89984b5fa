// A small declaration for ml-logistic-regression 2.0.0, which ships no types. Only what overask uses.
declare module "ml-logistic-regression" {
  import type { Matrix } from "ml-matrix";

  interface TwoClassClassifier {
    weights: Matrix | null;
    /** Full-batch gradient ascent from zero weights: `numSteps` steps of w += learningRate · Xᵀ(y − σ(Xw)). */
    train(features: Matrix, target: Matrix): void;
    /** σ(Xw) for each row. */
    testScores(features: Matrix): number[];
  }

  interface SerializedModel {
    name: "LogisticRegression";
    numSteps: number;
    learningRate: number;
    numberClasses: number;
    classifiers: { numSteps: number; learningRate: number; weights: number[][] | null }[];
  }

  export default class LogisticRegression {
    constructor(options?: { numSteps?: number; learningRate?: number });
    numSteps: number;
    learningRate: number;
    numberClasses: number;
    classifiers: TwoClassClassifier[];
    train(X: Matrix, Y: Matrix): void;
    predict(X: Matrix): number[];
    static load(model: SerializedModel): LogisticRegression;
    toJSON(): SerializedModel;
  }
}
