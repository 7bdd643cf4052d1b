/** How well a list of edge times reads as a tooth wheel: used to choose an edge direction or a VR polarity. */
import { dropGlitches, learnWheel, wheelAngles } from './learn-wheel';

/**
 * How well an edge direction reads as a tooth wheel: revolutions matched to the wheel learned from it, less
 * those left out and the edges repaired. A tooth's other edge can wander with sensor gap and noise (an edge
 * inside a gap on every other revolution, say); the clean direction matches more revolutions.
 */
export function directionScore(times: Float64Array): number {
  const clean = dropGlitches(times);
  const wheel = learnWheel(clean.times);
  const angles = wheel && wheelAngles(clean.times, wheel);
  if (!angles) return -Infinity;
  return angles.revolutions - angles.unmatched - 0.5 * (angles.inserted + angles.dropped);
}

