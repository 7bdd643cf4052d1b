/**
 * Who the client is: the socket unless the socket is a trusted proxy; then the forwarded chain walked from the
 * right, skipping trusted hops. Expected values follow the rules proxy-addr documents (its README: "the
 * trust... the address returned is the furthest address that is trusted") and Express's "trust proxy" guide.
 */
import { describe, expect, it } from 'vitest';
import { CLIENT_HEADER, clientAddress, trustFrom } from '../../server/client-address.mjs';

const req = (socket: string, xff?: string) => ({ headers: xff === undefined ? {} : { 'x-forwarded-for': xff }, socket: { remoteAddress: socket } });

describe('client address', () => {
  it('without trusted proxies, a forwarded header changes nothing: the socket is the client', () => {
    const none = trustFrom('');
    expect(clientAddress(req('127.0.0.1', '203.0.113.7'), none)).toBe('127.0.0.1');
    expect(clientAddress(req('198.51.100.20', '203.0.113.7, 10.0.0.1'), none)).toBe('198.51.100.20');
  });

  it('behind one trusted proxy, the hop it appended is the client; what the client wrote to the left is ignored', () => {
    const trust = trustFrom('10.0.0.5');
    // The client (203.0.113.7) forged "1.2.3.4"; the proxy appended the real address.
    expect(clientAddress(req('10.0.0.5', '1.2.3.4, 203.0.113.7'), trust)).toBe('203.0.113.7');
  });

  it('a chain of trusted hops is skipped from the right; an untrusted socket is the client whatever it forwards', () => {
    const trust = trustFrom('10.0.0.0/8, 192.0.2.1');
    expect(clientAddress(req('10.0.0.5', '198.51.100.4, 192.0.2.1, 10.1.2.3'), trust)).toBe('198.51.100.4');
    expect(clientAddress(req('198.51.100.99', '10.0.0.7'), trust)).toBe('198.51.100.99');
  });

  it('accepts proxy-addr names (loopback) and IPv6', () => {
    const trust = trustFrom('loopback');
    expect(clientAddress(req('::1', '2001:db8::5'), trust)).toBe('2001:db8::5');
    expect(clientAddress(req('127.0.0.1', '203.0.113.9'), trust)).toBe('203.0.113.9');
  });

  it('refuses a malformed trust list at start rather than trusting everyone', () => {
    expect(() => trustFrom('not-an-address')).toThrow();
  });

  it('the header the server writes is its own name, not one a proxy or client would send', () => {
    expect(CLIENT_HEADER).toBe('x-crankprint-client');
  });
});
