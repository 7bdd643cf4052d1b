export interface PgServer {
  url: string;
  version: string;
  stop(): void;
}
export function findPgBin(): string | null;
export function startPgServer(port?: number): PgServer | null;
export function createDatabase(serverUrl: string, prefix?: string): Promise<string>;
