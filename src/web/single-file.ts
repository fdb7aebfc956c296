/**
 * A Vite build step that makes the page one self-contained HTML file: the script and the style
 * sheet are inlined, the worker travels inside the script (Vite's `?worker&inline`, started from a
 * blob: URL), and a strict Content-Security-Policy naming the SHA-256 hashes of exactly the inlined
 * script and style is written as the first element of the head.
 *
 * Why one file: module scripts and module workers do not load from file:// in Chromium, and a page
 * that is one file keeps working when it is saved, e-mailed or opened with no server at all. The
 * same file is what the local server sends, so both ways of opening it run the same bytes.
 */
import { createHash } from 'node:crypto';
import type { Plugin } from 'vite';

/**
 * The page's Content-Security-Policy for the given inline script and style hashes: nothing may be
 * fetched or connected to; only the inlined script runs; the worker comes from a blob: URL made by
 * that script; images only from data: and blob: (the favicon is data:).
 *
 * @example
 * ```ts
 * contentSecurityPolicy(["'sha256-abc='"], ["'sha256-def='"]); // "default-src 'none'; script-src 'sha256-abc='; ..."
 * ```
 */
export function contentSecurityPolicy(scriptHashes: string[], styleHashes: string[]): string {
  return [
    "default-src 'none'",
    `script-src ${scriptHashes.join(' ')}`,
    `style-src ${styleHashes.length > 0 ? styleHashes.join(' ') : "'none'"}`,
    'worker-src blob:',
    'img-src data: blob:',
    "connect-src 'none'",
    "font-src 'none'",
    "media-src 'none'",
    "object-src 'none'",
    "frame-src 'none'",
    "manifest-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

/** The CSP source expression for a piece of inline text. */
function sha256(text: string): string {
  return `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;
}

/** Keep the HTML parser from ending the element early inside inlined code. */
function guard(code: string, tag: 'script' | 'style'): string {
  const safe = code.replace(new RegExp(`</(${tag})`, 'gi'), '<\\/$1');
  if (tag === 'script' && safe.includes('<!--')) {
    throw new Error("single-file page: the script contains '<!--', which an HTML parser could misread inside a <script> element.");
  }
  return safe;
}

/**
 * The Vite plugin (build only).
 *
 * @example
 * ```ts
 * export default defineConfig({ plugins: [singleFilePage()] });
 * ```
 */
export function singleFilePage(): Plugin {
  return {
    name: 'exact-dw:single-file-page',
    apply: 'build',
    enforce: 'post',
    generateBundle(_options, bundle) {
      const htmlNames = Object.keys(bundle).filter((name) => name.endsWith('.html'));
      if (htmlNames.length !== 1) throw new Error(`single-file page: expected one HTML page, found ${htmlNames.length}.`);
      const page = bundle[htmlNames[0]];
      if (page.type !== 'asset') throw new Error('single-file page: the HTML page is not an asset.');
      let html = typeof page.source === 'string' ? page.source : new TextDecoder().decode(page.source);
      const used = new Set<string>();
      const scriptHashes: string[] = [];
      const styleHashes: string[] = [];
      const fileOf = (ref: string): string => ref.replace(/^\.?\//, '');

      html = html.replace(/<script\b[^>]*\bsrc="([^"]+)"[^>]*><\/script>/g, (_tag, ref: string) => {
        const chunk = bundle[fileOf(ref)];
        if (!chunk || chunk.type !== 'chunk') throw new Error(`single-file page: no script chunk for ${ref}.`);
        if (chunk.imports.length > 0 || chunk.dynamicImports.length > 0) {
          throw new Error(`single-file page: ${ref} imports other chunks; the page must build into one script.`);
        }
        used.add(fileOf(ref));
        const code = guard(chunk.code, 'script');
        scriptHashes.push(sha256(code));
        return `<script type="module">${code}</script>`;
      });
      html = html.replace(/<link\b[^>]*\brel="stylesheet"[^>]*\bhref="([^"]+)"[^>]*>/g, (_tag, ref: string) => {
        const sheet = bundle[fileOf(ref)];
        if (!sheet || sheet.type !== 'asset') throw new Error(`single-file page: no style sheet for ${ref}.`);
        used.add(fileOf(ref));
        const css = guard(typeof sheet.source === 'string' ? sheet.source : new TextDecoder().decode(sheet.source), 'style');
        styleHashes.push(sha256(css));
        return `<style>${css}</style>`;
      });
      html = html.replace(/<link\b[^>]*\brel="modulepreload"[^>]*>/g, '');
      if (scriptHashes.length === 0) throw new Error('single-file page: the page has no script to inline.');

      const outside = html.match(/\b(?:src|href)="(?!data:|blob:|#)[^"]*"/);
      if (outside) throw new Error(`single-file page: the page still refers to a file: ${outside[0]}.`);
      const csp = `<meta http-equiv="Content-Security-Policy" content="${contentSecurityPolicy(scriptHashes, styleHashes)}">`;
      if (!/<meta charset="utf-8">/i.test(html)) throw new Error('single-file page: the page must start its head with <meta charset="utf-8">.');
      html = html.replace(/<meta charset="utf-8">/i, (m) => `${m}\n${csp}`);

      for (const name of used) delete bundle[name];
      const left = Object.keys(bundle).filter((name) => name !== htmlNames[0]);
      if (left.length > 0) throw new Error(`single-file page: files left beside the page: ${left.join(', ')}.`);
      page.source = html;
    },
  };
}
