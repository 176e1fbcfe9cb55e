"use client";

import { z } from "zod";
import { refuseCodeGeneration } from "@/lib/dsp/engine/codegen";

// The pages' Content-Security-Policy allows no eval, and a refused attempt is itself a reported
// violation, so nothing in the browser may even try: the DSP engine uses its generic loops (the
// same output bit for bit) and zod parses without compiling its fast paths (jitless).
refuseCodeGeneration();
z.config({ jitless: true });

/** Rendered first in the root layout, so the lines above run before any page parses or filters anything. */
export function NoEval() {
  return null;
}
