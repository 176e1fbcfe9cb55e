/// <reference lib="webworker" />
import { designZeros, type Complex, type FilterDesign } from "@/lib/dsp";
import { errorMessage } from "@/lib/errors";

/** Answer of the zeros worker: the zeros of the posted design, or why they could not be found. */
export type ZerosAnswer = { zeros: Complex[] } | { error: string };

/** Finds a design's zeros off the main thread (a 1023-tap FIR takes seconds of root finding). */
self.onmessage = (event: MessageEvent<FilterDesign>) => {
  let answer: ZerosAnswer;
  try {
    answer = { zeros: designZeros(event.data) };
  } catch (err) {
    answer = { error: errorMessage(err) };
  }
  self.postMessage(answer);
};
