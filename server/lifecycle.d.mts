export function shuttingDown(): boolean;
export function pastCutOff(): boolean;
export function beginStopping(): void;
export function cutOffWork(): void;
export function closeDatabase(): Promise<void>;
