/**
 * A sweep worker thread: loads the baseline once, then reads and judges the inputs it is sent.
 */
import { parentPort, workerData } from "node:worker_threads";
import { Judge } from "../../score/judge.js";
import type { Policy } from "../../score/policy/policy.js";
import type { Level } from "../../score/types.js";
import { readBaselineFile } from "../baseline.js";
import { scoreToLine, type SweepFormat, type SweepInput } from "./rows.js";

export interface WorkerSetup {
  baselinePath: string;
  format: SweepFormat;
  /** Read each app's dex code for code evidence. */
  readCode: boolean;
  category?: string;
  categoryIndex?: [string, string][];
  levels?: [string, Level | "off"][];
  /** Policies in force (plain data: they cross to the worker as they are). */
  policies?: Policy[];
  prevalence?: number;
}

const setup = workerData as WorkerSetup;
const judge = new Judge(readBaselineFile(setup.baselinePath));
const options = {
  ...(setup.category ? { category: setup.category } : {}),
  ...(setup.categoryIndex ? { categoryIndex: new Map(setup.categoryIndex) } : {}),
  levels: new Map(setup.levels ?? []),
  ...(setup.policies ? { policies: setup.policies } : {}),
  ...(setup.prevalence !== undefined ? { prevalence: setup.prevalence } : {}),
};

// Inputs come in small batches, to keep the messaging cost per app low.
parentPort!.on("message", (inputs: SweepInput[]) => {
  parentPort!.postMessage(inputs.map((input) => scoreToLine(judge, input, options, setup.format, setup.readCode)));
});
