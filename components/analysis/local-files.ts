'use client';
/** Files this tab just uploaded, by capture id: the workspace reads them locally instead of downloading them again. */
const files = new Map<string, Blob>();

export function rememberUpload(captureId: string, file: Blob): void {
  files.set(captureId, file);
}

export function localUpload(captureId: string): Blob | undefined {
  return files.get(captureId);
}
