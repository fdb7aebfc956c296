/** Types of serve.mjs, the page's tiny static server (plain Node ESM, run without a build step). */

/** The file under `root` that a request path names, or null when the path leaves `root`. */
export function resolveInside(root: string, urlPath: string): string | null;

/** A running server. */
export interface ServedPage {
  /** Address to open, e.g. http://127.0.0.1:8917/ */
  url: string;
  port: number;
  close(): Promise<void>;
}

/** Serve the files of `root` on `host:port` (port 0: any free port; host 127.0.0.1 by default). */
export function startServer(options: { root: string; port?: number; host?: string }): Promise<ServedPage>;
