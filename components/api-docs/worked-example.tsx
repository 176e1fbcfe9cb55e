/** How a firmware build fetches a channel's production coefficients: a curl line and a make rule. */
export function WorkedExample({ origin }: { origin: string }) {
  const channel = "hydraulic-press/press-ctl/ram-position";
  const url = `${origin}/api/v1/channels/${channel}/production/export?format=cmsis-df1&prefix=ram_position`;
  const curl = `curl -fsS --retry 3 -H "Authorization: Bearer $TAPWRIGHT_TOKEN" \\
  -o filters/ram_position.h "${url}"`;
  const make = `# Fetch the filter the device runs now, before every firmware build.
TAPWRIGHT_URL ?= ${origin}
CHANNEL       := ${channel}

filters/ram_position.h: FORCE
\tmkdir -p $(@D)
\tcurl -fsS --retry 3 -H "Authorization: Bearer $(TAPWRIGHT_TOKEN)" -o $@.tmp \\
\t  "$(TAPWRIGHT_URL)/api/v1/channels/$(CHANNEL)/production/export?format=cmsis-df1&prefix=ram_position"
\tmv $@.tmp $@

firmware.elf: filters/ram_position.h
FORCE:`;
  const use = `#include "filters/ram_position.h"   /* needs the library's arm_math.h on the include path */

ram_position_init();                   /* once */
ram_position_run(in, out);             /* every RAM_POSITION_BLOCK_SIZE samples */`;
  return (
    <section className="card space-y-3 p-4" data-testid="api-worked-example">
      <h2 className="font-semibold">Worked example: a firmware build fetches the production coefficients</h2>
      <p className="text-sm text-slate-600 dark:text-slate-300">
        Create a <b>read</b> token on the API tokens page and give it to the build as <code className="num text-xs">TAPWRIGHT_TOKEN</code>. The production
        route answers with the revision the channel&apos;s device acknowledged last, in the format it was deployed in; <code className="num text-xs">format=cmsis-df1</code>{" "}
        lays it out for the CMSIS-DSP library&apos;s kernels, and <code className="num text-xs">prefix</code> keeps the function names stable from revision to revision.
      </p>
      <h3 className="label">One download</h3>
      <pre className="num overflow-x-auto rounded bg-slate-100 p-3 text-xs dark:bg-slate-900">{curl}</pre>
      <h3 className="label">A make rule (refetched on every build; curl -f fails the build on 401, 404 or 422)</h3>
      <pre className="num overflow-x-auto rounded bg-slate-100 p-3 text-xs dark:bg-slate-900" data-testid="api-make-rule">{make}</pre>
      <h3 className="label">In the firmware</h3>
      <pre className="num overflow-x-auto rounded bg-slate-100 p-3 text-xs dark:bg-slate-900">{use}</pre>
      <p className="text-xs text-slate-500">
        The header&apos;s comment names the set, the revision, who approved it, the active deployment and its checksum, and the content hash (also in the{" "}
        <code>X-Content-SHA256</code> response header). A filter that is unstable is never served for firmware (422). Tapwright is an engineering aid: check
        the filter on the bench and with your team&apos;s review before it reaches a machine; the machine&apos;s safety documentation, local codes and licensed
        engineers decide.
      </p>
    </section>
  );
}
