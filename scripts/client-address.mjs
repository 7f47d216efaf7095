// The client address the app may trust, computed once per request by scripts/serve.mjs and
// handed to the app in the CLIENT_ADDRESS_HEADER request header (any copy sent by the
// client is dropped first).
//
// By default it is the socket's peer address: X-Forwarded-For is written by whoever sends
// the request and proves nothing. Only when the peer is one of TRUSTED_PROXIES (comma-
// separated addresses or CIDR blocks, e.g. "10.0.0.0/8, 127.0.0.1") is X-Forwarded-For read,
// from the right: the first entry that is not itself a trusted proxy is the client.
import { BlockList, isIP } from "node:net";

export const CLIENT_ADDRESS_HEADER = "x-bandkeep-client-address";

/** @param {string | undefined} spec */
export function trustedProxies(spec) {
  const list = new BlockList();
  for (const raw of (spec ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean)) {
    const [address, bits] = raw.split("/");
    const family = isIP(address);
    if (!family) throw new Error(`TRUSTED_PROXIES: "${raw}" is not an IP address or CIDR block`);
    const type = family === 6 ? "ipv6" : "ipv4";
    if (bits === undefined) list.addAddress(address, type);
    else {
      const prefix = Number(bits);
      if (!Number.isInteger(prefix) || prefix < 0 || prefix > (family === 6 ? 128 : 32))
        throw new Error(`TRUSTED_PROXIES: "${raw}" has a bad prefix length`);
      list.addSubnet(address, prefix, type);
    }
  }
  return list;
}

/** "::ffff:127.0.0.1" → "127.0.0.1"; anything that is not an address → undefined. */
function normalise(address) {
  if (!address) return undefined;
  const bare = address.trim().replace(/^\[|\]$/g, "");
  const v4 = bare.match(/^::ffff:(\d+\.\d+\.\d+\.\d+)$/i);
  const out = v4 ? v4[1] : bare;
  return isIP(out) ? out : undefined;
}

function isTrusted(list, address) {
  return list.check(address, isIP(address) === 6 ? "ipv6" : "ipv4");
}

/**
 * @param {string | undefined} peer the socket's remote address
 * @param {string | string[] | undefined} forwardedFor the X-Forwarded-For header(s)
 * @param {BlockList} proxies from trustedProxies()
 * @returns {string} the client address, or "unknown"
 */
export function clientAddress(peer, forwardedFor, proxies) {
  const socket = normalise(peer);
  if (!socket) return "unknown";
  if (!isTrusted(proxies, socket)) return socket;
  const hops = (Array.isArray(forwardedFor) ? forwardedFor.join(",") : (forwardedFor ?? ""))
    .split(",")
    .map((h) => h.trim())
    .filter(Boolean);
  let client = socket;
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = normalise(hops[i]);
    if (!hop) break; // a malformed entry: stop at the last address we could vouch for
    client = hop;
    if (!isTrusted(proxies, hop)) break;
  }
  return client;
}
