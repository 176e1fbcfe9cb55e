import { liveDesign, type FilterSpec, type LiveDesign } from "@/lib/dsp";

/**
 * A designer for loads that add the same few specs on hundreds of channels (npm run bench): each spec
 * is designed once, in-process, and its design shared, so the stream is measured and not the design
 * (the sidecar itself designs on threads; a second of synchronous designs here would stall heartbeats).
 */
export function sharedDesigns(): (spec: FilterSpec) => Promise<LiveDesign> {
  const designs = new Map<string, LiveDesign>();
  return async (spec) => {
    const key = JSON.stringify(spec);
    let live = designs.get(key);
    if (!live) designs.set(key, (live = liveDesign(spec)));
    return live;
  };
}
