/** Splits a shell command line into words: double and single quotes, backslash-newline continuations. */
export function shellWords(command: string): string[] {
  const text = command.replace(/\\\n/g, " ");
  const words: string[] = [];
  const re = /"((?:[^"\\]|\\.)*)"|'([^']*)'|(\S+)/g;
  for (const m of text.matchAll(re)) words.push(m[1] ?? m[2] ?? m[3]);
  return words;
}

/** The `npx overask …` commands in a Markdown file's ```sh blocks, continuation lines joined. */
export function documentedCommands(markdown: string): string[][] {
  const out: string[][] = [];
  for (const block of markdown.matchAll(/```sh\n([\s\S]*?)```/g)) {
    const joined = block[1].replace(/\\\n\s*/g, " ");
    for (const line of joined.split("\n")) {
      const cmd = line.replace(/\s+#.*$/, "").trim();
      if (cmd.startsWith("npx overask ")) out.push(shellWords(cmd).slice(2));
    }
  }
  return out;
}
