import type { IncomingMessage } from 'node:http';

export const CLIENT_HEADER: 'x-crankprint-client';
export function trustFrom(list?: string): (addr: string, i: number) => boolean;
export function clientAddress(req: Pick<IncomingMessage, 'headers' | 'socket'> | { headers: Record<string, string | undefined>; socket: { remoteAddress?: string } }, trust: (addr: string, i: number) => boolean): string;
