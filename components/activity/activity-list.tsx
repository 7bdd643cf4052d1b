/** Who did what and when, newest first: the shop's audit trail in plain words. */
import { formatWhen } from '@/domain/time';
import { actorLabel, describeEvent } from './describe';

export interface ActivityItem {
  id: string;
  action: string;
  detail: unknown;
  createdAt: Date;
  actorName?: string | null;
}

export function ActivityList({ items, timeZone, empty = 'Nothing recorded yet.' }: { items: ActivityItem[]; timeZone: string; empty?: string }) {
  if (items.length === 0) return <p className="text-muted">{empty}</p>;
  return (
    <ul className="mt-2 flex flex-col gap-1" data-testid="activity">
      {items.map((a) => (
        <li key={a.id} className="text-sm">
          <time className="figures text-muted" dateTime={a.createdAt.toISOString()}>
            {formatWhen(a.createdAt, timeZone)}
          </time>{' '}
          — <span className="font-bold">{actorLabel(a)}</span> {describeEvent(a)}
        </li>
      ))}
    </ul>
  );
}
