/**
 * The report renderers (text, Markdown, LaTeX, JSON), the paper paragraph and the citations, on
 * hand-made results that fill the bounds, power and dynamic-model slots (test/helpers/report-fixtures.ts).
 * Snapshots pin the layout; the other checks pin what a reader must (or must not) be told.
 */
import { describe, expect, it } from 'vitest';
import { renderText } from '../../src/report/text.js';
import { renderMarkdown } from '../../src/report/markdown.js';
import { renderLatex } from '../../src/report/latex.js';
import { renderJson } from '../../src/report/json.js';
import { paperParagraph } from '../../src/report/paragraph.js';
import { citations, citedKeys } from '../../src/report/citations.js';
import { VERSION } from '../../src/version.js';
import { boundsResolutionWords } from '../../src/report/wording.js';
import { inline } from '../../src/report/format.js';
import { FIXTURES, dynamicNoH, dynamicResult, negativeWithGaps, noInterceptLag4, staticResult } from '../helpers/report-fixtures.js';

/** The text with every run of white space (line breaks of the wrapped text report) made one space. */
const flat = (s: string) => s.replace(/\s+/g, ' ');

describe('snapshots of every renderer on fixed results', () => {
  for (const [name, make] of Object.entries(FIXTURES)) {
    it(`${name}: text, Markdown, LaTeX, JSON, paragraph (3 formats), BibTeX`, () => {
      const r = make();
      expect(renderText(r)).toMatchSnapshot('text');
      expect(renderMarkdown(r)).toMatchSnapshot('markdown');
      expect(renderLatex(r)).toMatchSnapshot('latex');
      expect(renderLatex(r, { standalone: false })).toMatchSnapshot('latex fragment');
      expect(renderJson(r)).toMatchSnapshot('json');
      expect(paperParagraph(r, 'text')).toMatchSnapshot('paragraph text');
      expect(paperParagraph(r, 'markdown')).toMatchSnapshot('paragraph markdown');
      expect(paperParagraph(r, 'latex')).toMatchSnapshot('paragraph latex');
      expect(citations(r)).toMatchSnapshot('bibtex');
    });
  }
});

describe('content every report must carry', () => {
  it('version, cautions and the plain-words decision appear in text, Markdown and LaTeX', () => {
    const r = staticResult();
    for (const out of [renderText(r), renderMarkdown(r), renderLatex(r)].map(flat)) {
      expect(out).toContain(`exact-dw ${VERSION}`);
      expect(out).toMatch(/normally distributed/);
      expect(out).toMatch(/strictly exogenous/);
      expect(out).toMatch(/No lagged dependent variable/);
      expect(out).toMatch(/assume a model with an intercept/);
      expect(out).toMatch(/supports, and does not replace, the analyst's judgement/);
      expect(out).toMatch(/the exact test rejects the null hypothesis of no first-order autocorrelation/);
    }
  });
  it('the chosen alternative and the other two p-values are all shown, the chosen one marked', () => {
    const t = renderText(staticResult());
    expect(t).toMatch(/positive autocorrelation\s+P\(D <= d\)\s+0\.0386\s+tested/);
    expect(t).toMatch(/negative autocorrelation\s+P\(D >= d\)\s+0\.9614\n/);
    expect(t).toMatch(/two-sided\)\s+twice the smaller tail\s+0\.0772\n/);
  });
  it('bounds: zone and resolution shown when present; when absent, the reason (no intercept, lag > 1, gaps)', () => {
    const s = flat(renderText(staticResult()));
    expect(s).toMatch(/between d_L and d_U: the bounds test is inconclusive/);
    expect(s).toContain('d_L = 1.188 <= d = 1.315 <= d_U = 1.546; the exact p-value for this design, 0.039, rejects at 5%');
    expect(flat(renderLatex(staticResult()))).toContain('$d_L = 1.188 \\le d = 1.315 \\le d_U = 1.546$');
    const a = flat(renderText(noInterceptLag4()));
    expect(a).toMatch(/the model has no intercept, and the bounds assume one/);
    expect(a).toMatch(/differences at lag 4, and the classical bounds are for lag 1/);
    const g = flat(renderText(negativeWithGaps()));
    expect(g).toMatch(/the time index has gaps/);
  });
  it('intercept added, detected or absent is stated', () => {
    expect(renderText(staticResult())).toMatch(/Intercept \.+ added by exact-dw/);
    expect(renderText(negativeWithGaps())).toMatch(/Intercept \.+ a constant column of the data/);
    expect(renderText(noInterceptLag4())).toMatch(/Intercept \.+ none/);
  });
  it('power: a long curve is thinned (here to rho = 0.1, ..., 0.9) and the target statement is given (reached / not reached)', () => {
    const t = renderText(staticResult());
    expect(t).toMatch(/The power reaches 80% at rho = 0\.617/);
    const rows = t.split('\n').filter((l) => /^\s+0\.\d+\s+0\.\d{4}$/.test(l));
    expect(rows.length).toBe(9); // rho = 0.1, 0.2, ..., 0.9
    expect(flat(renderText(negativeWithGaps()))).toMatch(/does not reach 90% for any rho between -0\.99 and 0 with this design/); // negative alternative: rho < 0
  });
  it('no power section when the slot is null', () => {
    expect(renderText(noInterceptLag4())).not.toMatch(/POWER/);
  });
});

describe('a model with a lagged dependent variable', () => {
  const r = dynamicResult();
  const outs = { text: renderText(r), markdown: renderMarkdown(r), latex: renderLatex(r) };
  it("does not present d's p-value, critical values, bounds or power as a test", () => {
    for (const out of Object.values(outs)) {
      expect(out).not.toContain('0.3801');   // the p-value of d
      expect(out).not.toContain('1.3606');   // its critical value
      expect(out).not.toContain('1.1879');   // d_L
      expect(out).not.toMatch(/Exact power/);
      expect(out).toMatch(/not a valid test/);
    }
  });
  it("leads with Durbin's h and Breusch-Godfrey, labelled asymptotic", () => {
    const t = outs.text;
    const conclusion = t.slice(t.indexOf('CONCLUSION'), t.indexOf('THE STATISTIC'));
    expect(conclusion).toMatch(/both asymptotic tests reject/i);
    expect(t.indexOf('LAGGED DEPENDENT VARIABLE (ASYMPTOTIC)')).toBeLessThan(t.indexOf('THE STATISTIC'));
    expect(t).toMatch(/Durbin's h +2\.3154 +0\.0103 +normal\n/);
    expect(t).toMatch(/Breusch-Godfrey LM, order 1 +4\.2113 +0\.0401 +chi-square, 1 df\n/);
    expect(t).toMatch(/p \(asymptotic\)/);
    expect(t).toContain('sales_lag1');
  });
  it('says why when h is undefined, and gives the Breusch-Godfrey verdict', () => {
    const t = flat(renderText(dynamicNoH()));
    expect(t).toMatch(/Durbin's h is undefined here: n V = 1\.31 >= 1 \(V = 0\.0546/);
    expect(t).not.toMatch(/undefined: Durbin's h/);
    expect(t).toMatch(/Breusch-Godfrey test does not reject/);
    expect(flat(paperParagraph(dynamicNoH()))).toMatch(/which is undefined here \(n V = 1\.31 >= 1\)/);
  });
  it('the paragraph does not give a p-value for d and cites Durbin 1970, Breusch 1978, Godfrey 1978', () => {
    const p = paperParagraph(r, 'text');
    expect(p).toMatch(/was not used as a test/);
    expect(p).not.toMatch(/exact p-value/);
    expect(p).toContain('(Durbin 1970)');
    expect(p).toContain('(Breusch 1978; Godfrey 1978)');
    expect(citedKeys(r)).toEqual(['durbin-watson-1950', 'durbin-watson-1951', 'durbin-1970', 'breusch-1978', 'godfrey-1978', 'exact-dw']);
  });
});

describe('citations: BibTeX for the methods actually used', () => {
  const keysOf = (bib: string) => [...bib.matchAll(/@(?:article|software)\{([^,]+),/g)].map((m) => m[1]);
  it('Imhof engine with bounds: Durbin-Watson 1950, 1951, Imhof 1961, Savin-White 1977, and the software', () => {
    expect(keysOf(citations(staticResult()))).toEqual(['durbin-watson-1950', 'durbin-watson-1951', 'imhof-1961', 'savin-white-1977', 'exact-dw']);
  });
  it('Pan engine at lag 4 without bounds: Pan 1968, Farebrother 1980 and Wallis 1972, no Savin-White', () => {
    expect(keysOf(citations(noInterceptLag4()))).toEqual(['durbin-watson-1950', 'durbin-watson-1951', 'wallis-1972', 'pan-1968', 'farebrother-1980', 'exact-dw']);
  });
  it('a static result with the Breusch-Godfrey test beside d cites Breusch (1978) and Godfrey (1978)', () => {
    const r = { ...staticResult(), breuschGodfrey: { order: 4, lm: 9.5, pChiSquare: 0.0497, f: 2.6, pF: 0.07, df1: 4, df2: 17, rSquared: 0.4, n: 24 } };
    expect(keysOf(citations(r))).toEqual(['durbin-watson-1950', 'durbin-watson-1951', 'imhof-1961', 'savin-white-1977', 'breusch-1978', 'godfrey-1978', 'exact-dw']);
    expect(paperParagraph(r, 'text')).toContain('Breusch-Godfrey test of order 4 (Breusch 1978; Godfrey 1978) gives LM = 9.50');
  });
  it('the software entry is a @software entry with the version', () => {
    const bib = citations(staticResult());
    expect(bib).toMatch(new RegExp(`@software\\{exact-dw,\n[\\s\\S]*version = \\{${VERSION.replace(/\./g, '\\.')}\\}`));
  });
  it('entries carry the volumes and pages of the brief (from memory)', () => {
    const all = citations(staticResult()) + citations(noInterceptLag4()) + citations(dynamicResult());
    for (const [key, volume, pages] of [
      ['durbin-watson-1950', '37', '409--428'], ['durbin-watson-1951', '38', '159--178'], ['imhof-1961', '48', '419--426'],
      ['pan-1968', '7', '281--292'], ['farebrother-1980', '29', '224--227'], ['savin-white-1977', '45', '1989--1996'],
      ['wallis-1972', '40', '617--636'], ['durbin-1970', '38', '410--421'], ['breusch-1978', '17', '334--355'], ['godfrey-1978', '46', '1293--1301'],
    ]) {
      const entry = all.slice(all.indexOf(`{${key},`), all.indexOf('\n}', all.indexOf(`{${key},`)));
      expect(entry).toContain(`volume  = {${volume}}`);
      expect(entry).toContain(`pages   = {${pages}}`);
    }
  });
  it('braces balance in every entry, and each entry is a well-formed @article', () => {
    for (const make of Object.values(FIXTURES)) {
      const bib = citations(make());
      let depth = 0;
      for (const ch of bib) { depth += ch === '{' ? 1 : ch === '}' ? -1 : 0; expect(depth).toBeGreaterThanOrEqual(0); }
      expect(depth).toBe(0);
      for (const entry of bib.split(/\n(?=@)/)) {
        expect(entry).toMatch(entry.startsWith('@software') ? /^@software\{exact-dw,\n( {2}\w+ += \{.*\},\n)+\}\n?/ : /^@article\{[a-z-]+\d{4},\n( {2}\w+ += \{.*\},\n)+\}\n?/);
      }
    }
  });
  it('the cite keys in the Markdown and LaTeX paragraphs are exactly the BibTeX keys', () => {
    for (const make of Object.values(FIXTURES)) {
      const r = make();
      const bibKeys = keysOf(citations(r)).sort();
      const md = [...paperParagraph(r, 'markdown').matchAll(/@([a-z0-9-]+)/g)].map((m) => m[1]);
      const tex = [...paperParagraph(r, 'latex').matchAll(/\\cite\{([^}]*)\}/g)].flatMap((m) => m[1].split(','));
      expect([...new Set(md)].sort()).toEqual(bibKeys);
      expect([...new Set(tex)].sort()).toEqual(bibKeys);
    }
  });
  it('every work a report cites in its References section has a BibTeX entry', () => {
    for (const make of Object.values(FIXTURES)) {
      const r = make();
      const listed = [...renderMarkdown(r).matchAll(/\[@([a-z0-9-]+)/g)].map((m) => m[1]);
      const bib = keysOf(citations(r));
      for (const k of listed) expect(bib).toContain(k);
    }
  });
});

describe('JSON', () => {
  it('parses back to exactly the numbers of the result, with the package version', () => {
    const r = staticResult();
    const j = JSON.parse(renderJson(r));
    expect(j.packageVersion).toBe(VERSION);
    expect(j.d).toBe(r.d);
    expect(j.pValue).toBe(r.pValue);
    expect(j.critical).toEqual(r.critical);
    // the typed codes stay, and the JSON keeps its sentences beside them (words from wording.ts)
    expect(j.bounds).toEqual({ ...r.bounds, resolution: inline(boundsResolutionWords(r.bounds!), 'text') });
    expect(j.bounds.outcome.code).toBe('BOUNDS_INCONCLUSIVE');
    expect(j.methodChoice).toEqual({ code: 'IMHOF_SPECTRUM' });
    expect(j.methodReason).toBe('Imhof integral on the spectrum');
    expect(j.power).toEqual(r.power);
    expect(j.coefficients).toEqual(r.coefficients);
  });
  it('has a stable key order whatever the order of the input object, and is deterministic', () => {
    const r = staticResult();
    const shuffled = Object.fromEntries(Object.entries(r).reverse()) as typeof r;
    shuffled.critical = { tailLevel: r.critical.tailLevel, upper: r.critical.upper, lower: r.critical.lower };
    expect(renderJson(shuffled)).toBe(renderJson(r));
    expect(renderJson(r)).toBe(renderJson(staticResult()));
    expect(Object.keys(JSON.parse(renderJson(r))).slice(0, 4)).toEqual(['packageVersion', 'd', 'n', 'k']);
    expect(Object.keys(JSON.parse(renderJson(dynamicResult())).dynamic.breuschGodfrey)).toEqual(['order', 'lm', 'pChiSquare', 'f', 'pF', 'df1', 'df2']);
  });
  it('writes non-finite numbers as null and keeps keys it does not know (sorted, after the known ones)', () => {
    const r = { ...staticResult(), rSquared: Number.NaN, zExtra: 1, aExtra: 2 } as ReturnType<typeof staticResult>;
    const j = JSON.parse(renderJson(r));
    expect(j.rSquared).toBeNull();
    const keys = Object.keys(j);
    expect(keys.slice(-2)).toEqual(['aExtra', 'zExtra']);
  });
});

describe('escaping of caller text', () => {
  it('a column name with LaTeX and Markdown specials is escaped, not interpreted', () => {
    const r = negativeWithGaps();
    expect(renderLatex(r)).toContain('\\texttt{area \\& share}');
    expect(renderMarkdown(r)).toContain('`area & share`');
    expect(paperParagraph(r, 'latex')).toContain('area \\& share');
    expect(renderLatex(r)).toContain('flow\\_m3');
  });
});
