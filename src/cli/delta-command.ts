/** `overask delta`. */
import { loadJudge } from "../ops/baseline.js";
import { delta } from "../ops/delta.js";
import { pickStyle } from "../report/style.js";
import { deltaToJson, deltaToText } from "../report/trim-delta.js";
import { deltaWorst } from "../score/delta.js";
import { gatesOf, tripsGate } from "../score/gates.js";
import type { Level } from "../score/types.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";
import { judgeOptions, type JudgingCliOptions } from "./judging.js";

export interface DeltaCliOptions extends JudgingCliOptions {
  format: "text" | "json";
  failOn?: Level;
  maxRisk?: number;
}

export async function deltaCommand(before: string, after: string, o: DeltaCliOptions, io: Io): Promise<number> {
  const { judge } = loadJudge(o.baseline);
  const d = delta(judge, before, after, judgeOptions(o, judge.baseline));
  const caution = judge.scorer ? judge.file.caution : undefined;
  io.stdout.write(o.format === "json" ? deltaToJson(d, [before, after], caution) : deltaToText(d, [before, after], caution, pickStyle(io.stdout, io.env)));
  // Gates weigh what the update newly brings, and the new version's risk.
  return tripsGate({ worst: deltaWorst(d), ...(d.after.risk !== undefined ? { risk: d.after.risk } : {}) }, gatesOf(o)) ? EXIT.GATE : EXIT.OK;
}
