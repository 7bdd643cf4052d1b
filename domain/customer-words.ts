/**
 * The test result in a customer's words: one sentence per finding, no interval notation, no status codes, and the
 * cylinder numbers said to be assumed wherever no cylinder 1 signal was recorded.
 */
import { type AnalysisResult, NUMBERING_ASSUMED } from '@/signal';

export interface CustomerFinding {
  /** The cylinders the sentence is about. */
  cylinders: number[];
  sentence: string;
  /** Whether the sentence is about a weak cylinder. */
  weak: boolean;
}

type Result = Pick<AnalysisResult, 'cylinders' | 'identity'>;

/** "about 60 %": to the nearest 5, never above 95 for a cylinder read weak. */
function about(percent: number, weak: boolean): number {
  const rounded = Math.round(percent / 5) * 5;
  return weak ? Math.min(95, rounded) : rounded;
}

function names(cylinders: number[]): string {
  if (cylinders.length === 1) return `${cylinders[0]}`;
  return `${cylinders.slice(0, -1).join(', ')} and ${cylinders[cylinders.length - 1]}`;
}

/** The sentences, weak cylinders first. */
export function customerFindings(r: Result): CustomerFinding[] {
  const tag = r.identity === 'assumed' ? ` ${NUMBERING_ASSUMED}` : '';
  const out: CustomerFinding[] = [];
  for (const c of r.cylinders.filter((x) => x.status === 'low' && x.relativePercent !== null)) {
    out.push({ cylinders: [c.cylinder], weak: true, sentence: `Cylinder ${c.cylinder}${tag} holds about ${about(c.relativePercent!, true)} % of the pressure of the others.` });
  }
  for (const c of r.cylinders.filter((x) => x.status === 'high' && x.relativePercent !== null)) {
    out.push({ cylinders: [c.cylinder], weak: false, sentence: `Cylinder ${c.cylinder}${tag} measured higher than the others; the shop will explain what that means.` });
  }
  const unclear = r.cylinders.filter((x) => x.status === 'uncertain' || x.relativePercent === null).map((x) => x.cylinder);
  if (unclear.length) {
    const verb = unclear.length === 1 ? `Cylinder ${unclear[0]}${tag} could not be measured clearly on this test` : `Cylinders ${names(unclear)}${tag} could not be measured clearly on this test`;
    out.push({ cylinders: unclear, weak: false, sentence: `${verb}; the shop checks ${unclear.length === 1 ? 'it' : 'them'} before any repair.` });
  }
  const alike = r.cylinders.filter((x) => x.status === 'ok').map((x) => x.cylinder);
  if (alike.length === r.cylinders.length) out.push({ cylinders: alike, weak: false, sentence: `All ${alike.length} cylinders measured alike.` });
  else if (alike.length) out.push({ cylinders: alike, weak: false, sentence: `${alike.length === 1 ? 'Cylinder' : 'Cylinders'} ${names(alike)}${tag} measured normal.` });
  return out;
}

/** The line under the bars. */
export const CUSTOMER_LEGEND =
  'Each bar is one cylinder, next to the others (100 % = like the healthy ones): striped, weaker; dotted, not clear on this test. The dashed line marks where a cylinder counts as weak.';
