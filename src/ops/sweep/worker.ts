/**
 * A sweep worker thread: loads the baseline once, then reads and judges the inputs it is sent.
 */
import { parentPort, workerData } from "node:worker_threads";
import { Judge } from "../../score/judge.js";
import { readBaselineFile } from "../baseline.js";
import { judgeOptionsOf, scoreToLine, type SweepInput, type SweepSetup } from "./rows.js";

export interface WorkerSetup extends SweepSetup {
  baselinePath: string;
}

const setup = workerData as WorkerSetup;
const judge = new Judge(readBaselineFile(setup.baselinePath));
const options = judgeOptionsOf(setup);

// Inputs come in small batches, to keep the messaging cost per app low.
parentPort!.on("message", (inputs: SweepInput[]) => {
  parentPort!.postMessage(inputs.map((input) => scoreToLine(judge, input, options, setup.format, setup.readCode)));
});
