/** `overask facts`. */
import { describeForCli } from "./hints.js";
import { facts } from "../ops/facts.js";
import { factsToJson, factsToText } from "../report/facts.js";
import { pickStyle } from "../report/style.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";

export function factsCommand(files: string[], o: { format: "text" | "json"; code?: boolean }, io: Io, debug: boolean): number {
  let failed = false;
  const results = facts(files, {
    code: o.code !== false,
    onError: (_file, e) => {
      io.stderr.write(`overask: ${describeForCli(e)}\n`);
      if (debug && e.stack) io.stderr.write(`${e.stack}\n`);
      failed = true;
    },
  });
  io.stdout.write(o.format === "json" ? factsToJson(results) : factsToText(results.filter((r) => r.manifest), pickStyle(io.stdout, io.env)));
  return failed ? EXIT.INPUT : EXIT.OK;
}
