import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

/** Debian's gcc; the compile-and-run checks of the C header are skipped with a message without it. */
export const GCC = "/usr/bin/gcc";
export const hasGcc = existsSync(GCC);

/** A scratch folder for generated headers and drivers; call `remove` after the tests. */
export function scratch(): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), "tw-export-gcc-"));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Deterministic input words: a 32-bit LCG (Numerical Recipes constants) at half scale, then full-scale steps. */
export function inputWords(bits: 15 | 31, n = 600): number[] {
  let state = 12345;
  const full = 2 ** bits;
  const words: number[] = [];
  for (let i = 0; i < n; i++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    words.push(Math.round((state / 2 ** 32 - 0.5) * full));
  }
  for (let i = 0; i < 200; i++) words.push(i % 100 < 50 ? full - 1 : -full);
  return words;
}

/**
 * Compiles a header with gcc -std=c99 -pedantic -Wall -Wextra -Werror next to a tiny driver that runs
 * the header's `<name>_step` over `inputs` (C literals of cType) and prints each output; returns the lines.
 */
export function compileAndRun(dir: string, name: string, header: string, inputs: string[], cType: string, printf: string, cast: string): string[] {
  const base = join(dir, name);
  writeFileSync(`${base}.h`, header);
  writeFileSync(
    `${base}_driver.c`,
    [
      "#include <stdio.h>",
      `#include "${name}.h"`,
      `static const ${cType} input[] = { ${inputs.join(", ")} };`,
      "int main(void) {",
      `    ${cType} state[${name.toUpperCase()}_STATE_WORDS] = { 0 };`,
      "    for (unsigned i = 0; i < sizeof input / sizeof input[0]; i++) {",
      `        printf("${printf}\\n", (${cast})${name}_step(state, input[i]));`,
      "    }",
      "    return 0;",
      "}",
      "",
    ].join("\n"),
  );
  execFileSync(GCC, ["-std=c99", "-pedantic", "-Wall", "-Wextra", "-Werror", "-O2", "-o", base, `${base}_driver.c`], { cwd: dir });
  return execFileSync(base, { encoding: "utf8", maxBuffer: 1 << 24 }).trim().split("\n");
}
