/**
 * Who may call the API until API tokens arrive with the accounts issue: only a caller on this machine.
 *
 * A Next.js route handler never sees the socket. What it sees is the request headers, and `next start`
 * fills `x-forwarded-for` from the socket's remote address, but only when the request did not bring that
 * header itself (node_modules/next/dist/server/base-server.js: `req.headers['x-forwarded-for'] ??=
 * socket.remoteAddress`). So the check is conservative: a request is local only when
 * - `x-forwarded-for` holds exactly one address and it is a loopback address (127.0.0.0/8, ::1, or
 *   ::ffff:127.x.y.z): a list means a proxy chain, and we cannot tell who is at its far end;
 * - `x-real-ip` and `forwarded`, if present, name only loopback addresses (a local proxy in front says
 *   where the request came from);
 * - the `host` header names this machine (localhost, a 127.x address or [::1]): a page on another site
 *   that a local browser was tricked into calling (DNS rebinding) carries that site's name.
 * A caller elsewhere can still forge all three headers; the hard guarantee is to bind the server to
 * loopback (`npm start -- -H 127.0.0.1`), as docs/api.md says. Anything else is refused.
 */

/** Whether an address (IPv4, IPv6 or IPv4-mapped IPv6) is a loopback address. */
export function isLoopbackAddress(address: string): boolean {
  const text = address.trim().toLowerCase().replace(/^\[(.*)\]$/, "$1");
  const ipv4 = text.startsWith("::ffff:") ? text.slice("::ffff:".length) : text;
  if (/^127(\.(25[0-5]|2[0-4]\d|1\d\d|[1-9]?\d)){3}$/.test(ipv4)) return true;
  return text === "::1" || text === "0:0:0:0:0:0:0:1";
}

/** Whether a Host header value names this machine: localhost, a loopback address, with or without a port. */
export function isLoopbackHost(host: string): boolean {
  const text = host.trim().toLowerCase();
  const name = text.startsWith("[") ? text.slice(0, text.indexOf("]") + 1) : text.replace(/:\d+$/, "");
  return name === "localhost" || isLoopbackAddress(name);
}

/** The `for=` addresses of a `Forwarded` header (RFC 7239), quotes and ports removed. */
function forwardedAddresses(header: string): string[] {
  return [...header.matchAll(/for=("?)([^";,]+)\1/gi)].map((match) => {
    const value = match[2] ?? "";
    return value.startsWith("[") ? value.slice(0, value.indexOf("]") + 1) : value.replace(/:\d+$/, "");
  });
}

/** Why a request is not accepted as local, or undefined when it is. */
export function loopbackRefusal(headers: Headers): string | undefined {
  const forwardedFor = headers.get("x-forwarded-for");
  if (forwardedFor === null) return "the caller's address is unknown";
  const chain = forwardedFor.split(",").map((entry) => entry.trim());
  if (chain.length !== 1 || !isLoopbackAddress(chain[0] ?? "")) return `the caller ${forwardedFor} is not on this machine`;
  const realIp = headers.get("x-real-ip");
  if (realIp !== null && !isLoopbackAddress(realIp)) return `the caller ${realIp} is not on this machine`;
  const forwarded = headers.get("forwarded");
  if (forwarded !== null) {
    const addresses = forwardedAddresses(forwarded);
    if (addresses.length === 0 || !addresses.every(isLoopbackAddress)) return `the caller ${forwarded} is not on this machine`;
  }
  const host = headers.get("host");
  if (host === null || !isLoopbackHost(host)) return `the host name ${host ?? "(none)"} is not this machine`;
  return undefined;
}
