/** `overask check`: judging inputs, printing, and the exit code that gates a build. */
import { describeForCli } from "./hints.js";
import { UsageError } from "../errors.js";
import { loadJudge } from "../ops/baseline.js";
import { checkFiles, checkRecords } from "../ops/check.js";
import { checkToJson, checkToText } from "../report/check.js";
import { checkToSarif } from "../report/sarif.js";
import { pickStyle } from "../report/style.js";
import { gatesOf } from "../score/gates.js";
import type { Level } from "../score/types.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";
import { judgeOptions, type JudgingCliOptions } from "./judging.js";

export interface CheckCliOptions extends JudgingCliOptions {
  format: "text" | "json" | "sarif" | "html";
  failOn?: Level;
  maxRisk?: number;
  records?: string;
  idField?: string;
  categoryField?: string;
  permissionsField?: string;
  columnsFrom?: string;
  columnsKind?: string;
}

export async function checkCommand(files: string[], o: CheckCliOptions, io: Io): Promise<number> {
  const { judge, baselineName } = loadJudge(o.baseline);
  const options = judgeOptions(o, judge.baseline);
  const gates = gatesOf(o);

  if (o.records && o.format !== "text" && o.format !== "json") throw new UsageError(`--records prints one JSON line per record; --format ${o.format} is not available with it`);
  if (o.records) {
    // --format is the output format here; the corpus format is told from its content.
    const corpus = {
      ...(o.idField ? { idField: o.idField } : {}),
      ...(o.categoryField ? { categoryField: o.categoryField } : {}),
      ...(o.permissionsField ? { permissionsField: o.permissionsField } : {}),
      ...(o.columnsFrom ? { columnsFrom: o.columnsFrom } : {}),
      ...(o.columnsKind ? { columnsKind: o.columnsKind } : {}),
    };
    let buffer = "";
    const outcome = await checkRecords(judge, o.records, corpus, options, gates, (score) => {
      buffer += `${JSON.stringify(score)}\n`;
      if (buffer.length > 1 << 16) {
        io.stdout.write(buffer);
        buffer = "";
      }
    });
    io.stdout.write(buffer);
    if (outcome.rejected > 0) {
      io.stderr.write(`overask: ${o.records}: ${outcome.rejected} of ${outcome.rows} records could not be read; first at line ${outcome.firstReject!.line}: ${outcome.firstReject!.reason}\n`);
      return EXIT.INPUT;
    }
    return outcome.gated ? EXIT.GATE : EXIT.OK;
  }
  if (files.length === 0) throw new UsageError("give files to check, or --records CORPUS");

  const outcome = checkFiles(judge, files, options, gates, (_file, e) => io.stderr.write(`overask: ${describeForCli(e)}\n`));
  const info = { baseline: baselineName, caution: judge.file.caution, ...(options.policies ? { policies: options.policies } : {}) };
  if (o.format === "html") {
    const { checkToHtml } = await import("../report/html/check-report.js");
    const { requestedRates } = await import("../score/requested.js");
    io.stdout.write(checkToHtml(outcome.runs.map((r) => (r.result ? { ...r, rates: requestedRates(judge, r.result) } : r)), { ...info, threshold: judge.baseline.parameters.uncommonBelow }));
  } else io.stdout.write(o.format === "json" ? checkToJson(outcome.runs, info) : o.format === "sarif" ? checkToSarif(outcome.runs, info) : checkToText(outcome.runs, info, pickStyle(io.stdout, io.env)));
  if (outcome.failed) return EXIT.INPUT;
  return outcome.gated ? EXIT.GATE : EXIT.OK;
}
