/** The customer's read-only report page: no account, one report, reached only through its share link. */
import type { Metadata } from 'next';
import { headers } from 'next/headers';
import { notFound } from 'next/navigation';
import { LogoMark } from '@/components/brand/logo';
import { CustomerBars } from '@/components/report/customer-bars';
import { customerFindings } from '@/domain/customer-words';
import { ESTIMATE_CAUTION, gaugePressures } from '@/domain/gauge-pressures';
import { approvalThroughLink, findShareLink, reportBundle } from '@/db/queries/reports';
import { getShopSettings } from '@/db/queries/shops';
import { formatWhen } from '@/domain/time';
import { withinBudget } from '@/server/rate-limit';
import { DecisionForm } from './decision-form';
import { vehicleTitle } from '@/domain/vehicle';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Your vehicle’s test result', robots: { index: false, follow: false }, referrer: 'no-referrer' };

export default async function CustomerReport({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  if (!(await withinBudget('share', await headers()))) {
    return (
      <main className="mx-auto max-w-2xl px-4 py-8 text-lg">
        <p role="alert">Too many attempts from your address to open report links. Wait a minute, then reload this page.</p>
      </main>
    );
  }
  const link = await findShareLink(token);
  const b = link && (await reportBundle(link.shopId, link.reportId));
  if (!link || !b) notFound();
  const r = b.analyses[0]?.analysis.result;
  const pressures = r && b.content.gauge ? gaugePressures(r, b.content.gauge) : null;
  const vehicle = vehicleTitle(b.vehicle);
  const low = r?.cylinders.filter((c) => c.status === 'low') ?? [];
  const { timeZone, phone, address } = await getShopSettings(link.shopId);
  const answer = await approvalThroughLink(link, b.report.revision);
  return (
    <main className="mx-auto flex max-w-2xl flex-col gap-5 px-4 py-8 text-lg">
      <header className="flex items-center gap-3">
        <LogoMark size={36} />
        <div>
          <p className="text-xl font-bold">{b.shop.name}</p>
          {address && <p className="whitespace-pre-line text-base">{address}</p>}
          {phone && <ShopPhone phone={phone} />}
          <p className="text-base text-muted">Repair order {b.job.repairOrder}</p>
        </div>
      </header>
      <h1 className="text-2xl font-bold">{vehicle}</h1>
      <p className="whitespace-pre-line">
        You told us: “{b.job.concern}” To find out whether the cause is inside the engine, we measured how well each cylinder holds compression while the engine was turned over by its starter.
      </p>
      {r && (
        <section aria-labelledby="result" className="rounded-2xl border border-line bg-surface p-4">
          <h2 id="result" className="text-xl font-bold">
            {low.length === 0 ? 'All cylinders measured alike' : `${low.length === 1 ? 'One cylinder is' : `${low.length} cylinders are`} weaker than the others`}
          </h2>
          <ul className="my-3 flex flex-col gap-1" data-testid="customer-findings">
            {customerFindings(r).map((f) => (
              <li key={f.sentence} className={f.weak ? 'font-bold' : ''}>
                {f.sentence}
              </li>
            ))}
          </ul>
          <CustomerBars cylinders={r.cylinders} lowLimit={r.settings.lowLimitPercent} />
          <p className="mt-2 text-base">This is a screening test; the next step confirms it.</p>
          {pressures && !('problem' in pressures) && (
            <p className="mt-2 text-base" data-testid="customer-pressures">
              {pressures.sentence} {ESTIMATE_CAUTION}
            </p>
          )}
          {r.startingSystem?.customerLine && (
            <p className="mt-2 text-base" data-testid="customer-starting">
              {r.startingSystem.customerLine}
            </p>
          )}
        </section>
      )}
      <section aria-labelledby="next" className="rounded-2xl border-2 border-brand bg-surface p-4">
        <h2 id="next" className="text-xl font-bold">
          What we recommend next
        </h2>
        <ol className="mt-2 list-decimal pl-6">
          {(b.content.nextSteps.length ? b.content.nextSteps : ['Talk with your service advisor about the next step.']).map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ol>
        {answer ? (
          <p className="mt-3 rounded-xl bg-raised p-3 font-bold" data-testid="customer-answer">
            {answer.decision === 'approve' ? 'You approved the recommended next step' : 'You declined the recommended next step for now'} on {formatWhen(answer.createdAt, timeZone)} (signed “{answer.typedName}”). The shop has been told; call
            them to change it.
          </p>
        ) : (
          <>
            {phone && (
              <p className="mt-3 text-base">
                Questions before you answer? Call {b.shop.name} at <ShopPhone phone={phone} inline />.
              </p>
            )}
            <DecisionForm token={token} revision={b.report.revision} />
          </>
        )}
      </section>
      <p className="text-sm text-muted">Report revision {b.report.revision}. This page expires on {formatWhen(link.expiresAt, timeZone)}.</p>
    </main>
  );
}

/** The shop's phone as a link a phone can dial (the digits and a leading +), shown as typed. */
function ShopPhone({ phone, inline = false }: { phone: string; inline?: boolean }) {
  const dial = phone.replace(/[^\d+]/g, '');
  const link = dial.length >= 3 ? (
    <a className="font-bold underline" href={`tel:${dial}`}>
      {phone}
    </a>
  ) : (
    <span className="font-bold">{phone}</span>
  );
  return inline ? link : <p className="text-base">Phone {link}</p>;
}
