// Stepstock serving HTTPS itself with a certificate and key (TLS_CERT, TLS_KEY), as a shop's server
// does for the tablets on its network: a throwaway certificate for 127.0.0.1 is made here with
// openssl, and a client that trusts only that certificate gets the app and the API over TLS.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { demoDatabase, failOnPageErrors } from './support';
import { httpsGet, startServer, type ServerProcess } from '../support/server-process';

failOnPageErrors();

let dir: string;
let cert: Buffer;
let database: Awaited<ReturnType<typeof demoDatabase>>;
let server: ServerProcess;

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'stepstock-tls-'));
  const certFile = path.join(dir, 'cert.pem');
  const keyFile = path.join(dir, 'key.pem');
  execFileSync('openssl', selfSigned('/CN=127.0.0.1', keyFile, certFile, 'IP:127.0.0.1'), {
    stdio: 'ignore',
  });
  cert = readFileSync(certFile);
  database = await demoDatabase();
  server = await startServer(database.url, { TLS_CERT: certFile, TLS_KEY: keyFile });
});

afterAll(async () => {
  await server?.stop();
  await database?.drop();
  rmSync(dir, { recursive: true, force: true });
});

describe('HTTPS from Stepstock itself', () => {
  it('when TLS_CERT and TLS_KEY are given, then the app and the API answer over HTTPS with HSTS', async () => {
    expect(server.url).toMatch(/^https:\/\/127\.0\.0\.1:\d+$/);
    const health = await httpsGet(`${server.url}/api/health`, cert);
    expect(health.status).toBe(200);
    const page = await httpsGet(`${server.url}/jobs`, cert);
    expect(page.status).toBe(200);
    expect(page.body).toContain('<app-root');
    expect(String(page.headers['strict-transport-security'])).toMatch(/max-age=\d+/);
  });

  it('when the tablet asks for the service worker over HTTPS, then the worker, its file list and the manifest are served', async () => {
    // Browsers run a service worker only on a secure origin: this is what a tablet on the LAN gets.
    const worker = await httpsGet(`${server.url}/ngsw-worker.js`, cert);
    expect(worker.status).toBe(200);
    expect(String(worker.headers['content-type'])).toMatch(/javascript/);
    const list = await httpsGet(`${server.url}/ngsw.json`, cert);
    expect(list.status).toBe(200);
    expect(String(list.headers['content-type'])).toMatch(/^application\/json/);
    const files = JSON.parse(list.body) as { assetGroups: { urls: string[] }[] };
    expect(files.assetGroups.flatMap((g) => g.urls)).toContain('/index.html');
    const manifest = await httpsGet(`${server.url}/manifest.webmanifest`, cert);
    expect(manifest.status).toBe(200);
    expect(String(manifest.headers['content-type'])).toMatch(/^application\/manifest\+json/);
  });

  it('when a client does not trust the certificate, then it gets no answer', async () => {
    // No -out: openssl writes the certificate to stdout.
    const other = execFileSync('openssl', selfSigned('/CN=elsewhere', '/dev/null'), {
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
    });
    await expect(httpsGet(`${server.url}/api/health`, Buffer.from(other))).rejects.toThrow();
  });

  it('when plain HTTP is tried on the same port, then it is not served', async () => {
    const res = await fetch(`${server.url.replace('https', 'http')}/api/health`).catch(() => null);
    expect(res === null || res.status === 400).toBe(true);
  });
});

/** openssl's arguments for a throwaway self-signed certificate of one day (to stdout without certFile). */
function selfSigned(subject: string, keyFile: string, certFile?: string, altName?: string): string[] {
  return [
    ...['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-days', '1', '-subj', subject],
    ...(altName ? ['-addext', `subjectAltName=${altName}`] : []),
    ...['-keyout', keyFile],
    ...(certFile ? ['-out', certFile] : []),
  ];
}
