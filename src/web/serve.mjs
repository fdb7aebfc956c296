// @ts-check
/**
 * A tiny static file server for the built page, on the loopback interface only: `npm run web`
 * builds the page into docs/site and runs this file, which prints the address to open. The
 * browser tests import `startServer` to serve their own build on an ephemeral port.
 *
 * Plain Node ESM (no build step, no dependency), because it must run before and without any
 * compilation; its types are in serve.d.mts. It serves GET and HEAD of files under one folder,
 * refuses paths that leave it, and sends no-store caching and a frame-ancestors policy (the page's
 * own Content-Security-Policy is in its HTML).
 */
import { createServer } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, relative, resolve, isAbsolute, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** @type {Record<string, string>} */
const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.csv': 'text/csv; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.md': 'text/markdown; charset=utf-8',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
};

const HEADERS = {
  'Cache-Control': 'no-store',
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Content-Security-Policy': "frame-ancestors 'none'",
  'Cross-Origin-Opener-Policy': 'same-origin',
};

/**
 * The file under `root` that a request path names, or null when the path leaves `root` or is not
 * valid.
 * @param {string} root absolute folder
 * @param {string} urlPath path part of the request URL
 * @returns {string | null}
 */
export function resolveInside(root, urlPath) {
  let path;
  try {
    path = decodeURIComponent(urlPath.split('?')[0].split('#')[0]);
  } catch {
    return null;
  }
  if (path.includes('\0')) return null;
  const target = resolve(root, '.' + (path.startsWith('/') ? path : '/' + path));
  const rel = relative(root, target);
  if (rel.startsWith('..' + sep) || rel === '..' || isAbsolute(rel)) return null;
  return target;
}

/**
 * Serve the files of `root` on `host:port` (port 0: any free port).
 * @param {{ root: string, port?: number, host?: string }} options
 * @returns {Promise<{ url: string, port: number, close: () => Promise<void> }>}
 */
export function startServer({ root, port = 0, host = '127.0.0.1' }) {
  const base = resolve(root);
  const server = createServer(async (req, res) => {
    const send = (/** @type {number} */ status, /** @type {string} */ text) => {
      res.writeHead(status, { ...HEADERS, 'Content-Type': 'text/plain; charset=utf-8' });
      res.end(req.method === 'HEAD' ? undefined : text + '\n');
    };
    if (req.method !== 'GET' && req.method !== 'HEAD') return send(405, 'Only GET and HEAD are served.');
    let file = resolveInside(base, req.url ?? '/');
    if (file === null) return send(404, 'Not found.');
    try {
      if ((await stat(file)).isDirectory()) file = join(file, 'index.html');
      const body = await readFile(file);
      res.writeHead(200, { ...HEADERS, 'Content-Type': TYPES[extname(file).toLowerCase()] ?? 'application/octet-stream', 'Content-Length': body.length });
      res.end(req.method === 'HEAD' ? undefined : body);
    } catch {
      send(404, 'Not found.');
    }
  });
  return new Promise((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      const address = server.address();
      const actual = typeof address === 'object' && address ? address.port : port;
      resolvePromise({
        url: `http://${host}:${actual}/`,
        port: actual,
        close: () => new Promise((done) => { server.closeAllConnections(); server.close(() => done()); }),
      });
    });
  });
}

/** Command line: node src/web/serve.mjs [--root DIR] [--port N] */
async function main() {
  const args = process.argv.slice(2);
  const value = (/** @type {string} */ name) => {
    const i = args.indexOf(name);
    return i >= 0 ? args[i + 1] : undefined;
  };
  const root = resolve(value('--root') ?? fileURLToPath(new URL('../../docs/site', import.meta.url)));
  const wanted = Number(value('--port') ?? 8917);
  if (!Number.isInteger(wanted) || wanted < 0 || wanted > 65535) {
    process.stderr.write(`--port must be a whole number from 0 to 65535 (got '${value('--port')}').\n`);
    process.exit(2);
  }
  try {
    await stat(join(root, 'index.html'));
  } catch {
    process.stderr.write(`There is no built page in ${root}. Build it first: npm run web (builds, then serves).\n`);
    process.exit(2);
  }
  let served;
  try {
    served = await startServer({ root, port: wanted });
  } catch (err) {
    if (/** @type {NodeJS.ErrnoException} */ (err).code !== 'EADDRINUSE') throw err;
    served = await startServer({ root, port: 0 });
    process.stdout.write(`(port ${wanted} is busy; using ${served.port})\n`);
  }
  process.stdout.write(`exact-dw page: ${served.url}\n`);
  process.stdout.write(`It also works opened directly, with no server: ${pathToFileURL(join(root, 'index.html')).href}\n`);
  process.stdout.write('Serving on this computer only (127.0.0.1). Press Ctrl+C to stop.\n');
  const stop = () => { void served.close().then(() => process.exit(0)); };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  main().catch((err) => {
    process.stderr.write(`The page server could not start: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(1);
  });
}
