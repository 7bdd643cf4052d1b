/** An audit event in plain words: what happened, with the detail that matters to the shop. */
import { JOB_STATUS_LABEL } from '@/components/data/jobs/status';
import type { JobStatus } from '@/domain/job';
import { retentionWords } from '@/domain/retention';

interface Event {
  action: string;
  detail: unknown;
}

type Detail = Record<string, string | number | null | undefined>;

const WORDS: Record<string, (d: Detail) => string> = {
  'auth.sign-in': () => 'signed in',
  'shop.create': () => 'created the shop',
  'job.create': () => 'created a job',
  'job.cautions-read': () => 'read the safety cautions',
  'job.status': (d) => `moved a job from ${statusWords(d.from)} to ${statusWords(d.to)}${d.reason ? `: “${d.reason}”` : d.cause ? ` (${d.cause})` : ''}`,
  'job.update': (d) => (d.status ? `set a job to ${d.status}` : 'changed a job'),
  'job.delete': (d) => `removed job ${d.repairOrder ?? ''} with ${d.captures ?? 0} capture(s)`.replace('  ', ' '),
  'vehicle.create': () => 'added a vehicle',
  'capture.upload': (d) => `uploaded ${d.fileName ?? 'a capture'}${typeof d.sizeBytes === 'number' ? ` (${(d.sizeBytes / 1048576).toFixed(1)} MB)` : ''}`,
  'analysis.save': (d) => `saved an analysis${d.verdict ? ` (${d.verdict})` : ''}`,
  'profile.create': () => 'added an engine profile',
  'report.save': () => 'edited a report',
  'report.sign': (d) => `signed a report${d.revision ? ` (revision ${d.revision})` : ''}`,
  'report.send': (d) => `e-mailed a report${d.to ? ` to ${d.to}` : ''}`,
  'report.share': () => 'made a customer link',
  'report.unshare': () => 'revoked a customer link',
  'report.approve': (d) => `approved the recommended next step${d.typedName ? ` (signed “${d.typedName}”)` : ''}`,
  'report.decline': (d) => `declined the recommended next step${d.typedName ? ` (signed “${d.typedName}”)` : ''}`,
  'invitation.create': (d) => `invited ${d.email ?? 'someone'}${d.role ? ` as ${d.role}` : ''}`,
  'invitation.cancel': () => 'cancelled an invitation',
  'member.role': (d) => `changed a member's role${d.from && d.to ? ` from ${d.from} to ${d.to}` : ''}`,
  'member.remove': (d) => `removed a member${d.role ? ` (${d.role})` : ''}`,
  'shop.retention': (d) => `set captures and analyses to be ${retentionWords(typeof d.days === 'number' ? d.days : null)}`,
  'shop.retention-sweep': (d) => `removed ${d.captures ?? 0} capture(s) of ${d.jobs ?? 0} job(s) done more than ${d.days ?? '?'} days ago${d.drafts ? `, and ${d.drafts} unsigned report draft(s)` : ''}`,
  'storage.remove-orphans': (d) => `removed ${d.count ?? 'some'} capture file(s) that no capture referenced from object storage`,
};

const statusWords = (s: unknown) => (JOB_STATUS_LABEL[s as JobStatus] ?? String(s ?? '')).toLowerCase();

export function describeEvent(e: Event): string {
  const words = WORDS[e.action];
  return words ? words((e.detail ?? {}) as Detail) : e.action;
}

/** Who did it: the member's name; the customer for a decision on a share link. */
export function actorLabel(e: Event & { actorName?: string | null }): string {
  if (e.actorName) return e.actorName;
  if (e.action.startsWith('storage.')) return 'Maintenance (db:check)';
  if (e.action === 'shop.retention-sweep') return 'The daily retention sweep';
  if (e.action === 'report.approve' || e.action === 'report.decline') return 'The customer';
  // A job moved by the customer's answer.
  if (e.action === 'job.status' && (e.detail as Detail | null)?.cause === 'customer answered') return 'The customer’s answer';
  return 'A removed account';
}
