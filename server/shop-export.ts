/**
 * A shop's export as one zip, streamed as the client reads it (fflate; entries stored, not compressed, so no
 * deflating runs on the request thread): shop.json (name, settings, retention, members), jobs.json (every job
 * with its vehicle, captures' details, analyses, report revisions and answers), each capture's file as uploaded
 * under captures/, and each signed revision's PDF under reports/ (drawn in the engine's thread pool).
 */
import 'server-only';
import { Zip, ZipPassThrough } from 'fflate';
import { listCaptures, readCaptureStream } from '@/db/queries/captures';
import { listRevisions, reportBundle } from '@/db/queries/reports';
import { jobDetailsForExport, shopJobList } from '@/db/queries/shop-data';
import { renderPdf } from './engine/pool';
import { withoutControls } from './file-name';
import { pdfDataFor } from './pdf/build-report';

interface Entry {
  name: string;
  data: () => Promise<Uint8Array | ReadableStream<Uint8Array> | null>;
}

/** A name safe as one path part in a zip: no slashes, backslashes or control characters. */
function part(name: string): string {
  return withoutControls(name).replace(/[/\\]/g, '_').trim().slice(0, 150) || '_';
}

const encode = (text: string) => new TextEncoder().encode(text);
const json = (value: unknown) => encode(`${JSON.stringify(value, null, 2)}\n`);

/** jobs.json as a stream: one job at a time with its details, so a large shop never sits in memory whole. */
function jobsJson(shopId: string, list: Awaited<ReturnType<typeof shopJobList>>): ReadableStream<Uint8Array> {
  let i = -1;
  return new ReadableStream({
    async pull(controller) {
      i++;
      if (i === 0) return controller.enqueue(encode(list.length ? '[\n' : '[]\n'));
      const job = list[i - 1];
      if (!job) return controller.close();
      const details = await jobDetailsForExport(shopId, job.id);
      controller.enqueue(encode(`${JSON.stringify({ ...job, ...details }, null, 2)}${i < list.length ? ',' : '\n]'}\n`));
    },
  });
}

async function* entries(shopId: string, shop: unknown): AsyncGenerator<Entry> {
  const list = await shopJobList(shopId);
  yield { name: 'shop.json', data: async () => json({ ...(shop as object), exportedAt: new Date().toISOString() }) };
  yield { name: 'jobs.json', data: async () => jobsJson(shopId, list) };
  for (const job of list) {
    const folder = part(job.repairOrder);
    const files = await listCaptures(shopId, job.id);
    for (const c of files) yield { name: `captures/${folder}/${c.id.slice(0, 8)}-${part(c.fileName)}`, data: () => readCaptureStream(shopId, c.id) };
    for (const r of (await listRevisions(shopId, job.id)).filter((x) => x.status === 'signed')) {
      yield {
        name: `reports/${folder}-rev${r.revision}.pdf`,
        data: async () => {
          const b = await reportBundle(shopId, r.id);
          return b ? new Uint8Array(await renderPdf(await pdfDataFor(b))) : null;
        },
      };
    }
  }
}

export function shopExportStream(shopId: string, shop: unknown, signal?: AbortSignal): ReadableStream<Uint8Array> {
  const out: Uint8Array[] = [];
  let finished = false;
  let failed: unknown = null;
  const zip = new Zip((err, chunk, final) => {
    if (err) failed = err;
    else {
      out.push(chunk);
      if (final) finished = true;
    }
  });
  // Each step adds at most one piece of one file, so the stream is read no faster than the client takes it.
  const steps = (async function* () {
    for await (const e of entries(shopId, shop)) {
      if (signal?.aborted) return;
      const data = await e.data();
      if (!data) continue;
      const file = new ZipPassThrough(e.name);
      zip.add(file);
      if (data instanceof Uint8Array) file.push(data, true);
      else {
        for await (const piece of data as unknown as AsyncIterable<Uint8Array>) {
          file.push(piece);
          yield;
        }
        file.push(new Uint8Array(0), true);
      }
      yield;
    }
    zip.end();
  })();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      for (;;) {
        if (failed) return controller.error(failed);
        if (out.length) return controller.enqueue(out.shift()!);
        if (finished) return controller.close();
        if ((await steps.next()).done && !out.length && !finished) return controller.close();
      }
    },
    async cancel() {
      await steps.return(undefined);
    },
  });
}
