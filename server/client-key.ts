/**
 * The key a client's rate-limit budget is kept under: an IPv4 address as it is (also when written as IPv6,
 * `::ffff:a.b.c.d`), an IPv6 address by its /64 network (one subscriber holds a whole /64, so every address in it
 * is the same client).
 */
import { isIPv4, isIPv6 } from 'node:net';

export function clientKey(address: string): string {
  const a = address.trim().toLowerCase().replace(/^\[|\]$/g, '');
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(a);
  if (mapped && isIPv4(mapped[1])) return mapped[1];
  if (!isIPv6(a)) return a;
  return `${expand(a).slice(0, 4).join(':')}::/64`;
}

/** The eight 16-bit groups of an IPv6 address, without leading zeros. */
function expand(a: string): string[] {
  const [head, tail = ''] = a.split('::');
  const h = head ? head.split(':') : [];
  const t = tail ? tail.split(':') : [];
  // An embedded IPv4 tail counts as two groups.
  const groups = (g: string[]) => g.flatMap((x) => (x.includes('.') ? ipv4Groups(x) : [x]));
  const hh = groups(h);
  const tt = groups(t);
  const zeros = a.includes('::') ? new Array<string>(8 - hh.length - tt.length).fill('0') : [];
  return [...hh, ...zeros, ...tt].map((x) => parseInt(x, 16).toString(16));
}

function ipv4Groups(v4: string): string[] {
  const [a, b, c, d] = v4.split('.').map(Number);
  return [((a << 8) | b).toString(16), ((c << 8) | d).toString(16)];
}
