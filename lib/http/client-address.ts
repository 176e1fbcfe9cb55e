import { BlockList, isIP } from "node:net";

/**
 * The configured proxies (TRUSTED_PROXIES: comma-separated addresses or CIDR blocks, IPv4 or IPv6)
 * as a BlockList; throws naming an entry that is neither.
 */
export function trustedProxies(list: string): BlockList {
  const blocks = new BlockList();
  for (const entry of list.split(",").map((s) => s.trim()).filter(Boolean)) {
    const [address, bits] = entry.split("/");
    const family = isIP(address);
    if (family === 0 || (bits !== undefined && !/^\d{1,3}$/.test(bits))) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an address or CIDR block`);
    const type = family === 4 ? "ipv4" : "ipv6";
    if (bits === undefined) blocks.addAddress(address, type);
    else blocks.addSubnet(address, Number(bits), type);
  }
  return blocks;
}

/** An IPv4 address in IPv6 form (::ffff:a.b.c.d), as Node reports IPv4 peers on a dual-stack socket, in plain form. */
function plain(address: string): string {
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(address);
  return mapped ? mapped[1] : address;
}

function isTrusted(address: string, proxies: BlockList): boolean {
  const family = isIP(address);
  return family !== 0 && proxies.check(address, family === 4 ? "ipv4" : "ipv6");
}

/**
 * The client's address from X-Forwarded-For, whose last entry the web server sets to the socket's
 * peer (server/run/web.ts). Read from the right, an entry is believed only while the hop that added
 * it is a trusted proxy: the answer is the rightmost address not in `proxies`, so a client cannot
 * choose its address by sending the header. Null when there is no usable entry.
 */
export function clientAddress(forwardedFor: string | null, proxies: BlockList): string | null {
  const hops = (forwardedFor ?? "").split(",").map((s) => plain(s.trim())).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) {
    if (isIP(hops[i]) === 0) return null;
    if (i === 0 || !isTrusted(hops[i], proxies)) return hops[i];
  }
  return null;
}
