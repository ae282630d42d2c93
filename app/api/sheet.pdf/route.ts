/**
 * GET /api/sheet.pdf?template=NAME|key=ROOMKEY[&units=ip][&paper=letter]: the sheet printed to PDF on the
 * server by Debian's chromium (playwright-core), from this same server's /sheet page.
 * POST /api/sheet.pdf with a section file as the body: the same for a document that lives only in the browser.
 * One PDF at a time (chromium is heavy); the page is loaded over loopback, never from a host in the request.
 */
import { parseSectionText } from '@/lib/section/validate';
import { formatProblem } from '@/lib/section/errors';
import { templateByName } from '@/lib/section/templates/index';
import { urlToPdf } from '@/lib/render/node-chromium';

export const runtime = 'nodejs';
export const dynamic = 'force-dynamic';

const MAX_BODY = 2 * 1024 * 1024;
let queue: Promise<unknown> = Promise.resolve();

function origin(): string {
  return process.env.DEWLINE_SHEET_ORIGIN ?? `http://127.0.0.1:${process.env.PORT ?? 3000}`;
}

function bad(status: number, message: string) {
  return new Response(message + '\n', { status, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}

async function render(query: URLSearchParams, name: string, storage?: Record<string, string>): Promise<Response> {
  const paper = query.get('paper') === 'letter' ? 'Letter' : 'A4';
  const job = queue.then(() => urlToPdf(`${origin()}/sheet?${query.toString()}`, { format: paper, waitForSelector: '[data-ready="yes"], [data-testid="sheet-error"]', sessionStorage: storage, timeoutMs: 150_000 }));
  queue = job.catch(() => undefined);
  let pdf: Buffer;
  try {
    pdf = await job;
  } catch (e) {
    return bad(500, `the PDF could not be made: ${(e as Error).message.split('\n')[0]}`);
  }
  return new Response(new Uint8Array(pdf), { status: 200, headers: { 'content-type': 'application/pdf', 'content-disposition': `attachment; filename="${name}-sheet.pdf"`, 'cache-control': 'no-store' } });
}

function common(url: URL): URLSearchParams {
  const q = new URLSearchParams();
  const units = url.searchParams.get('units');
  const paper = url.searchParams.get('paper');
  if (units) {
    if (units !== 'si' && units !== 'ip') throw new RangeError(`units: must be si or ip, got '${units}'`);
    q.set('units', units);
  }
  if (paper) {
    if (paper !== 'a4' && paper !== 'letter') throw new RangeError(`paper: must be a4 or letter, got '${paper}'`);
    q.set('paper', paper);
  }
  return q;
}

export async function GET(req: Request): Promise<Response> {
  const url = new URL(req.url);
  let q: URLSearchParams;
  try { q = common(url); } catch (e) { return bad(400, (e as Error).message); }
  const template = url.searchParams.get('template'), key = url.searchParams.get('key');
  if (template) {
    if (!templateByName(template)) return bad(404, `there is no template named '${template}'`);
    q.set('template', template);
    return render(q, template);
  }
  if (key) {
    if (!/^[A-Za-z0-9_-]{16,64}$/.test(key)) return bad(400, 'key: not a room key');
    q.set('key', key);
    return render(q, 'room');
  }
  return bad(400, 'give ?template=NAME or ?key=ROOMKEY, or POST a section file');
}

export async function POST(req: Request): Promise<Response> {
  const url = new URL(req.url);
  let q: URLSearchParams;
  try { q = common(url); } catch (e) { return bad(400, (e as Error).message); }
  const text = await req.text();
  if (text.length > MAX_BODY) return bad(413, `the section file is larger than ${MAX_BODY} bytes`);
  const v = parseSectionText(text);
  if (!v.ok) return bad(400, v.problems.map(formatProblem).join('\n'));
  q.set('open', '1');
  return render(q, 'section', { 'dewline:open': JSON.stringify(v.section) });
}
