import ipaddr from 'ipaddr.js';

/**
 * Which IP addresses a webhook may be sent to. Only public unicast addresses: private networks,
 * loopback, link-local (cloud metadata at 169.254.169.254), unique-local, carrier-grade NAT,
 * multicast, reserved and unspecified ranges are refused. An IPv4-mapped IPv6 address is judged by
 * the IPv4 address inside; the translation prefixes (NAT64, 6to4, Teredo) are refused outright.
 * ipaddr.js names the ranges (its `range()` table follows the IANA special-purpose registries).
 */
export function refusedAddressReason(address: string): string | null {
  if (!ipaddr.isValid(address)) return `“${address}” is not an IP address`;
  let parsed = ipaddr.parse(address);
  if (parsed.kind() === 'ipv6') {
    const v6 = parsed as ipaddr.IPv6;
    if (v6.isIPv4MappedAddress()) parsed = v6.toIPv4Address();
  }
  const range = parsed.range();
  if (range === 'unicast') return null;
  return `${address} is a ${RANGE_WORDS[range] ?? `${range} address`}`;
}

const RANGE_WORDS: Record<string, string> = {
  private: 'private network address',
  loopback: 'loopback address (this machine)',
  linkLocal: 'link-local address',
  uniqueLocal: 'unique-local (private IPv6) address',
  carrierGradeNat: 'carrier-grade NAT address',
  unspecified: 'unspecified address',
  multicast: 'multicast address',
  broadcast: 'broadcast address',
  reserved: 'reserved address',
  rfc6052: 'NAT64 address',
  rfc6145: 'IPv4-translated address',
  '6to4': '6to4 address',
  teredo: 'Teredo address',
  as112: 'AS112 address',
  amt: 'AMT address',
  benchmarking: 'benchmarking address',
  orchid2: 'ORCHIDv2 address',
  discard: 'discard-only address',
  deprecated: 'deprecated address',
};
