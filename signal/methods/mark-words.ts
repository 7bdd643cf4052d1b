/** Cylinder-1 marks (cam, injector, coil): their default offset to cylinder 1's compression TDC, and their words. */
import type { MarkSource } from '../import/edge-log';

/** Crank degrees from a mark to cylinder 1's compression TDC when the settings give none. */
export const DEFAULT_MARK_OFFSET_DEG: Record<MarkSource, number> = { cam: 0, injector: 360, coil: 0 };
export const MARK_WORDS: Record<MarkSource, string> = { cam: 'a cam channel', injector: 'the cylinder 1 injector output', coil: 'the cylinder 1 coil output' };
