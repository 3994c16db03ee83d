// Drill: three supplier price lists of 50 MB each arrive at once, and thirty photo uploads far over
// the limit. The server process's resident memory is sampled from /proc throughout and must stay
// under 300 MB; every list is imported in full (two at a time, the third waits its turn) and
// /api/health keeps answering within a second.
import { randomUUID } from 'node:crypto';
import { openAsBlob } from 'node:fs';
import { mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sleep,
  sqlClient,
  startServer,
  type DrillDatabase,
  type ServerProcess,
} from './support';

jest.setTimeout(600_000);

const CEILING_MB = 300;
const LIST_BYTES = 49.5 * 1024 * 1024;

let database: DrillDatabase;
let server: ServerProcess | null = null;
let dir = '';

beforeAll(async () => {
  database = await drillDatabase('uploads');
  dir = await mkdtemp(path.join(tmpdir(), 'stepstock-upload-drill-'));
});

afterAll(async () => {
  await server?.stop();
  await database?.drop();
  if (dir) await rm(dir, { recursive: true, force: true });
});

/** A plain list of about `bytes`, long descriptions so the rows are few enough to import quickly. */
async function writeList(file: string, prefix: string, bytes: number): Promise<number> {
  const lines = ['sku,description,size_mm,oversize_mm,price,currency,available'];
  const filler = 'cast piston with pin and clips and rings boxed from the maker'.padEnd(240, '.');
  let size = lines[0].length + 1;
  let i = 0;
  while (size < bytes) {
    i++;
    const step = i % 5;
    const line = `${prefix}-${String(i).padStart(7, '0')},${filler} ${i},${(54 + step * 0.25).toFixed(2)},${(step * 0.25).toFixed(2)},${(30 + (i % 900) / 100).toFixed(2)},EUR,${i % 9}`;
    lines.push(line);
    size += line.length + 1;
  }
  await writeFile(file, `${lines.join('\n')}\n`);
  return i;
}

function rssMb(pid: number): number {
  let status = '';
  try {
    status = readFileSync(`/proc/${pid}/status`, 'utf8');
  } catch {
    return 0; // the process has ended
  }
  const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(status)?.[1] ?? 0);
  return kb / 1024;
}

/** Declares a huge photo and sends only its start, as a client flooding the upload would. */
function hugePhoto(url: string, session: HttpSession, jobPath: string): Promise<number> {
  return new Promise((resolve) => {
    const u = new URL(url);
    const req = http.request(
      {
        host: u.hostname,
        port: u.port,
        path: jobPath,
        method: 'POST',
        headers: {
          'content-type': 'multipart/form-data; boundary=drill',
          'content-length': String(25 * 1024 * 1024),
          'x-xsrf-token': session.xsrf,
          cookie: `stepstock.sid=${encodeURIComponent(session.sid)}; XSRF-TOKEN=${encodeURIComponent(session.xsrf)}`,
        },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve(res.statusCode ?? 0));
      },
    );
    req.on('error', () => resolve(0));
    req.write('--drill\r\nContent-Disposition: form-data; name="photo"; filename="a.jpg"\r\n\r\n');
    req.write(Buffer.alloc(256 * 1024));
  });
}

describe('upload memory', () => {
  it('when three 50 MB price lists and thirty oversize photos arrive at once, then the server stays under 300 MB, imports every list and health answers within a second', async () => {
    const client = await sqlClient(database.url);
    try {
      const staff = await insertUser(client, 'staff');
      const owner = await insertUser(client, 'owner');
      server = await startServer(database.url, {
        STEPSTOCK_NO_BACKGROUND: '1',
        IMPORT_WAIT_SECONDS: '300',
      });
      const pid = server.process.pid as number;
      const session = new HttpSession(server.url);
      await session.signIn(staff);
      const ownerSession = new HttpSession(server.url);
      await ownerSession.signIn(owner);

      const suppliers: string[] = [];
      const files: Array<{ file: string; rows: number }> = [];
      for (const name of ['A', 'B', 'C'].slice(0, Number(process.env.DRILL_LISTS ?? 3))) {
        const made = await ownerSession.post('/api/suppliers', {
          name: `Drill bulk supplier ${name}`,
          currency: 'EUR',
          leadDays: 5,
        });
        expect(made.status).toBe(201);
        suppliers.push((made.body as { id: string }).id);
        const file = path.join(dir, `list-${name}.csv`);
        files.push({ file, rows: await writeList(file, `DB${name}`, LIST_BYTES) });
      }
      for (const f of files) expect((await stat(f.file)).size).toBeLessThan(50 * 1024 * 1024);

      const idle = rssMb(pid);
      let peak = idle;
      let sampling = true;
      const sampler = (async () => {
        while (sampling) {
          peak = Math.max(peak, rssMb(pid));
          await sleep(100);
        }
      })();
      const healthMs: number[] = [];
      const health = (async () => {
        while (sampling) {
          const started = performance.now();
          try {
            const res = await fetch(`${server!.url}/api/health`, {
              signal: AbortSignal.timeout(10_000),
            });
            await res.text();
          } catch {
            /* no answer within 10 s: recorded as such */
          }
          healthMs.push(performance.now() - started);
          await sleep(250);
        }
      })();

      const uploads = Promise.all(
        files.map(async (f, i) =>
          session.upload(
            `/api/suppliers/${suppliers[i]}/price-lists`,
            { file: await openAsBlob(f.file) },
            `list-${i}.csv`,
            { timeoutMs: 480_000 },
          ),
        ),
      );
      // The size is refused before the job is looked up: any job id will do.
      const photoPath = `/api/jobs/${randomUUID()}/photos`;
      const photos = Promise.all(
        Array.from({ length: 30 }, () => hugePhoto(server!.url, session, photoPath)),
      );
      const [answers, photoStatuses] = await Promise.all([uploads, photos]).catch((e: Error) => {
        sampling = false;
        throw new Error(
          `${e.message}; peak ${Math.round(peak)} MB, health ${JSON.stringify(healthMs.map(Math.round))}\n${server!.log().slice(-3000)}`,
        );
      });
      sampling = false;
      await Promise.all([sampler, health]);

      process.stdout.write(
        `${JSON.stringify({ drill: 'upload-memory', idleMb: Math.round(idle), peakMb: Math.round(peak), slowestHealthMs: Math.round(Math.max(...healthMs)), rows: files.map((f) => f.rows) })}\n`,
      );
      if (answers.some((a) => a.status !== 201)) {
        throw new Error(
          `uploads answered ${JSON.stringify(answers.map((a) => a.status))}\n${server
            .log()
            .split('\n')
            .filter((l) => l.startsWith('{') && JSON.parse(l).level >= 50)
            .map((l) => JSON.stringify(JSON.parse(l).err ?? JSON.parse(l).msg).slice(0, 800))
            .join('\n')}`,
        );
      }
      answers.forEach((a, i) =>
        expect((a.body as { counts: { ok: number } }).counts.ok).toBe(files[i].rows),
      );
      expect(new Set(photoStatuses)).toEqual(new Set([413]));
      expect(peak).toBeLessThan(CEILING_MB);
      expect(Math.max(...healthMs)).toBeLessThan(1000);
    } finally {
      await client.end();
    }
  });
});
