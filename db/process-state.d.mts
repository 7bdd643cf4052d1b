export function processShared<T>(key: string, create: () => T): T;
