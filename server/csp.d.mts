export function contentSecurityPolicy(o?: { nonce?: string; frameAncestors?: string; dev?: boolean }): string;
