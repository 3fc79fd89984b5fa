/**
 * The `overask` command: commander wiring only. Each command parses its options, calls the library,
 * picks a formatter and sets the exit code.
 */
import { Command, CommanderError, Option } from "commander";
import { InputError } from "../errors.js";
import type { FactsResult } from "../report/facts.js";
import { pickStyle } from "../report/style.js";
import { TOOL_VERSION } from "../version.js";
import { EXIT } from "./exit-codes.js";

interface Io {
  stdout: { write(s: string): unknown; isTTY?: boolean };
  stderr: { write(s: string): unknown; isTTY?: boolean };
  env: NodeJS.ProcessEnv;
}

const defaultIo: Io = { stdout: process.stdout, stderr: process.stderr, env: process.env };

/** Runs the CLI with `argv` (without the node and script entries) and returns the exit code. */
export async function run(argv: string[], io: Io = defaultIo): Promise<number> {
  let exitCode: number = EXIT.OK;
  const debug = argv.includes("--debug");
  const program = new Command()
    .name("overask")
    .description("Read Android manifests and weigh the permissions they request against apps of the same category.")
    .version(TOOL_VERSION, "-V, --version")
    .option("--debug", "print stack traces for errors")
    .showHelpAfterError("(run overask --help for usage)")
    .configureOutput({ writeOut: (s) => io.stdout.write(s), writeErr: (s) => io.stderr.write(s) })
    .exitOverride();

  program
    .command("facts")
    .description("read APKs or manifests (binary or plain XML) and print what they declare")
    .argument("<file...>", "APK, binary AndroidManifest.xml or plain AndroidManifest.xml files")
    .addOption(new Option("-f, --format <format>", "output format").choices(["text", "json"]).default("text"))
    .action(async (files: string[], opts: { format: "text" | "json" }) => {
      // Commands load their modules when run, so `--help` and `--version` start fast.
      const { readManifestFile } = await import("../extract/index.js");
      const { factsToJson, factsToText } = await import("../report/facts.js");
      const results: FactsResult[] = [];
      for (const file of files) {
        try {
          results.push({ file, manifest: readManifestFile(file) });
        } catch (e) {
          if (!(e instanceof InputError)) throw e;
          results.push({ file, error: { kind: e.name, message: e.message } });
          io.stderr.write(`overask: ${e.describe()}\n`);
          if (debug && e.stack) io.stderr.write(`${e.stack}\n`);
          exitCode = EXIT.INPUT;
        }
      }
      io.stdout.write(opts.format === "json" ? factsToJson(results) : factsToText(results.filter((r) => r.manifest), pickStyle(io.stdout, io.env)));
    });

  try {
    await program.parseAsync(argv, { from: "user" });
  } catch (e) {
    if (e instanceof CommanderError) {
      // --help and --version end here too, with code 0.
      return e.exitCode === 0 ? EXIT.OK : EXIT.USAGE;
    }
    if (e instanceof InputError) {
      io.stderr.write(`overask: ${e.describe()}\n`);
      if (debug && e.stack) io.stderr.write(`${e.stack}\n`);
      return EXIT.INPUT;
    }
    io.stderr.write(`overask: internal error: ${(e as Error)?.message ?? String(e)}${debug ? "" : " (rerun with --debug for details)"}\n`);
    if (debug && e instanceof Error && e.stack) io.stderr.write(`${e.stack}\n`);
    return EXIT.INTERNAL;
  }
  return exitCode;
}
