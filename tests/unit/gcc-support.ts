import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

/** Debian's gcc, a set-up requirement (server/run/setup.sh installs it): the compile-and-run checks are never skipped. */
export const GCC = "/usr/bin/gcc";

/** Runs gcc with the strict flags every check uses; a missing gcc fails with what to do. */
export function gcc(args: string[], cwd: string): void {
  if (!existsSync(GCC)) throw new Error(`${GCC} is missing: npm test installs it (server/run/setup.sh --with-browser), or run apt-get install gcc libc6-dev`);
  execFileSync(GCC, ["-std=c99", "-pedantic", "-Wall", "-Wextra", "-Werror", "-O2", ...args], { cwd, stdio: ["ignore", "pipe", "pipe"] });
}

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
  gcc(["-o", base, `${base}_driver.c`], dir);
  return execFileSync(base, { encoding: "utf8", maxBuffer: 1 << 24 }).trim().split("\n");
}

/** The stand-in arm_math.h and the documented kernel arithmetic (tests/unit/cmsis-harness). */
const HARNESS = join(import.meta.dirname, "cmsis-harness");

/**
 * Compiles a cmsis-df1/df2t header as firmware would use it (its `<stem>_init()` once, then
 * `<stem>_run(in, out)` or `<stem>_run_fast(in, out)` per block) against the stand-in library, with gcc
 * -std=c99 -pedantic -Wall -Wextra -Werror and the address and undefined-behaviour sanitizers (so a
 * state or coefficient array too small for what the init functions touch fails the run). Feeds
 * `inputs` block by block (their count a multiple of the block size) and returns every output.
 */
export function compileAndRunCmsis(
  dir: string,
  file: string,
  header: string,
  opts: { inputs: string[]; cType: string; printf: string; cast: string; fast?: boolean; blockSize?: number },
): string[] {
  const STEM = /#ifndef (\w+)_BLOCK_SIZE/.exec(header)?.[1];
  if (!STEM) throw new Error("not a CMSIS export header");
  const stem = STEM.toLowerCase();
  const block = opts.blockSize ?? Number(/#define \w+_BLOCK_SIZE (\d+)/.exec(header)?.[1]);
  if (opts.inputs.length % block !== 0) throw new Error(`${opts.inputs.length} inputs are not whole blocks of ${block}`);
  const base = join(dir, `${file}${opts.fast ? "_fast" : ""}`);
  writeFileSync(join(dir, `${file}.h`), header);
  writeFileSync(
    `${base}_driver.c`,
    [
      "#include <stdio.h>",
      ...(opts.blockSize ? [`#define ${STEM}_BLOCK_SIZE ${opts.blockSize}`] : []),
      `#include "${file}.h"`,
      `static const ${opts.cType} input[] = { ${opts.inputs.join(", ")} };`,
      "int main(void) {",
      `    ${opts.cType} in[${STEM}_BLOCK_SIZE], out[${STEM}_BLOCK_SIZE];`,
      `    ${stem}_init();`,
      `    for (unsigned start = 0; start < sizeof input / sizeof input[0]; start += ${STEM}_BLOCK_SIZE) {`,
      `        for (unsigned i = 0; i < ${STEM}_BLOCK_SIZE; i++) in[i] = input[start + i];`,
      `        ${stem}_run${opts.fast ? "_fast" : ""}(in, out);`,
      `        for (unsigned i = 0; i < ${STEM}_BLOCK_SIZE; i++) printf("${opts.printf}\\n", (${opts.cast})out[i]);`,
      "    }",
      "    return 0;",
      "}",
      "",
    ].join("\n"),
  );
  gcc(["-I", HARNESS, "-fsanitize=address,undefined", "-fno-sanitize-recover=all", "-o", base, `${base}_driver.c`, join(HARNESS, "kernels.c")], dir);
  return execFileSync(base, { encoding: "utf8", maxBuffer: 1 << 24 }).trim().split("\n");
}
