/*
 * The runnable examples of the integrators' guide (docs/integrators/*.md): how they are found in a page
 * and how an answer is compared with the one the page documents. The format is described for authors in
 * docs/integrators/index.md ("How the examples are checked").
 */
import MarkdownIt from 'markdown-it';

/** The comment that keeps the block after it from being run. */
export const NOT_RUN_MARKER = /<!--\s*example:\s*not run\s*-->/;

/** The languages of a documented answer. */
export type AnswerLanguage = 'json' | 'http' | 'text';

/** One example of a page: a curl command or a TypeScript program, and the answer documented after it. */
export interface Example {
  readonly page: string;
  /** The line of the block's opening fence, from 1. */
  readonly line: number;
  readonly kind: 'curl' | 'ts';
  readonly code: string;
  readonly answer?: { readonly language: AnswerLanguage; readonly text: string; readonly line: number };
}

/** What a page asks of the key its examples are given (YAML front matter `examples: { … }`). */
export interface PageSettings {
  /** The limit of the page's key, in calculations per minute (600 unless said). */
  readonly keyLimitPerMinute: number;
}

const markdown = new MarkdownIt({ html: true });

/** The examples of a page, in order. A `sh` block is an example when its first word is `curl`. */
export function examplesOf(page: string, text: string): Example[] {
  const examples: Example[] = [];
  const tokens = markdown.parse(text, {});
  /** The example whose answer the next fenced block may be. */
  let open: { index: number } | undefined;
  let skipNext = false;
  for (const token of tokens) {
    if (token.type === 'html_block' || token.type === 'html_inline') {
      if (NOT_RUN_MARKER.test(token.content)) skipNext = true;
      continue;
    }
    if (token.type !== 'fence') continue;
    const language = token.info.trim().split(/\s+/)[0] ?? '';
    const line = (token.map?.[0] ?? 0) + 1;
    if (skipNext) {
      skipNext = false;
      open = undefined;
      continue;
    }
    const isCurl = (language === 'sh' || language === 'bash') && /^\s*curl\s/.test(token.content);
    if (isCurl || language === 'ts') {
      examples.push({ page, line, kind: isCurl ? 'curl' : 'ts', code: token.content });
      open = { index: examples.length - 1 };
      continue;
    }
    if (open !== undefined && (language === 'json' || language === 'http' || language === 'text')) {
      const example = examples[open.index]!;
      examples[open.index] = { ...example, answer: { language, text: token.content, line } };
    }
    open = undefined;
  }
  return examples;
}

/** The page's settings from its front matter (`examples:\n  keyLimitPerMinute: 3`). */
export function settingsOf(text: string): PageSettings {
  const frontMatter = /^---\n([\s\S]*?)\n---\n/.exec(text)?.[1] ?? '';
  const limit = /^\s+keyLimitPerMinute:\s*(\d+)\s*$/m.exec(frontMatter)?.[1];
  return { keyLimitPerMinute: limit === undefined ? 600 : Number(limit) };
}

/** `"<anything>"`: a value the page does not fix. `"<$NAME>"` also keeps the value as `$NAME`. */
const PLACEHOLDER = /^<([^<>]+)>$/;
const CAPTURE = /^\$([A-Z][A-Z0-9_]*)$/;

/** Values kept by `<$NAME>` placeholders, for the later examples of the same page. */
export type Captures = Record<string, string>;

const capture = (name: string, value: unknown, captures: Captures) => {
  const variable = CAPTURE.exec(name)?.[1];
  if (variable !== undefined) captures[variable] = typeof value === 'string' ? value : JSON.stringify(value);
};

/**
 * The actual value with every place the documented one leaves open replaced by its placeholder, so
 * that `expect(normalised).toEqual(documented)` compares the rest, with a readable difference.
 * Captures the values of `<$NAME>` placeholders on the way.
 */
export function normaliseJson(documented: unknown, actual: unknown, captures: Captures): unknown {
  if (typeof documented === 'string') {
    const placeholder = PLACEHOLDER.exec(documented)?.[1];
    if (placeholder !== undefined && actual !== undefined) {
      capture(placeholder, actual, captures);
      return documented;
    }
    // A sentence with a number that changes: "Try again in <seconds> s."
    return typeof actual === 'string' ? normaliseLine(documented, actual, captures) : actual;
  }
  if (Array.isArray(documented) && Array.isArray(actual)) {
    return actual.map((item, index) =>
      index < documented.length ? normaliseJson(documented[index], item, captures) : item,
    );
  }
  if (isObject(documented) && isObject(actual)) {
    return Object.fromEntries(
      Object.entries(actual).map(([key, value]) => [
        key,
        key in documented ? normaliseJson(documented[key], value, captures) : value,
      ]),
    );
  }
  return actual;
}

const isObject = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/** A pattern of one documented line whose `<…>` placeholders match any run of characters. */
function linePattern(documented: string): { pattern: RegExp; names: string[] } | undefined {
  const names: string[] = [];
  const parts = documented.split(/(<[^<>]+>)/);
  if (parts.length === 1) return undefined;
  const source = parts
    .map((part) => {
      const placeholder = PLACEHOLDER.exec(part)?.[1];
      if (placeholder === undefined) return part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
      names.push(placeholder);
      return '(.*?)';
    })
    .join('');
  return { pattern: new RegExp(`^${source}$`), names };
}

/** One actual line, shown as the documented one when it matches the documented line's placeholders. */
export function normaliseLine(documented: string, actual: string, captures: Captures): string {
  const line = linePattern(documented);
  const match = line?.pattern.exec(actual);
  if (!line || !match) return actual;
  line.names.forEach((name, index) => capture(name, match[index + 1], captures));
  return documented;
}

/** Text compared line by line, trimmed at both ends. */
export function normaliseText(documented: string, actual: string, captures: Captures): string {
  const expected = documented.trim().split('\n');
  return actual
    .trim()
    .split('\n')
    .map((line, index) => (index < expected.length ? normaliseLine(expected[index]!, line, captures) : line))
    .join('\n');
}

/** An HTTP answer as the page shows it, or as `curl -i` prints it. */
export interface HttpAnswer {
  readonly status: number;
  readonly headers: Record<string, string>;
  readonly body: string;
}

/** Reads `HTTP/1.1 200 OK`, the headers, a blank line and the body; `curl -i`'s 1xx answers are skipped. */
export function parseHttp(text: string): HttpAnswer {
  let rest = text.replace(/\r\n/g, '\n').replace(/^\s+/, '');
  for (;;) {
    const end = rest.indexOf('\n\n');
    const head = end === -1 ? rest : rest.slice(0, end);
    const body = end === -1 ? '' : rest.slice(end + 2);
    const [statusLine = '', ...headerLines] = head.split('\n');
    const status = /^HTTP\/[\d.]+ (\d{3})/.exec(statusLine)?.[1];
    if (status === undefined) throw new Error(`Not an HTTP answer (curl needs -i): ${statusLine}`);
    if (status.startsWith('1')) {
      rest = body;
      continue;
    }
    const headers: Record<string, string> = {};
    for (const line of headerLines) {
      const colon = line.indexOf(':');
      if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
    }
    return { status: Number(status), headers, body };
  }
}

/** What of an answer is compared: the documented form, and the actual one normalised to it. */
export interface Comparison {
  readonly documented: unknown;
  readonly actual: unknown;
}

const parseJson = (text: string, what: string): unknown => {
  try {
    return JSON.parse(text);
  } catch {
    throw new Error(`${what} is not JSON:\n${text}`);
  }
};

/** Puts an actual answer beside the documented one, placeholders filled and captured. */
export function compareAnswer(
  language: AnswerLanguage,
  documentedText: string,
  actualText: string,
  captures: Captures,
): Comparison {
  if (language === 'json') {
    const documented = parseJson(documentedText, 'The documented answer');
    let actual: unknown;
    try {
      actual = JSON.parse(actualText);
    } catch {
      return { documented, actual: actualText };
    }
    return { documented, actual: normaliseJson(documented, actual, captures) };
  }
  if (language === 'text') {
    return { documented: documentedText.trim(), actual: normaliseText(documentedText, actualText, captures) };
  }
  const documented = parseHttp(documentedText);
  const actual = parseHttp(actualText);
  const headers: Record<string, string | undefined> = {};
  for (const [name, value] of Object.entries(documented.headers)) {
    const actualValue = actual.headers[name];
    headers[name] = actualValue === undefined ? undefined : normaliseLine(value, actualValue, captures);
  }
  const documentedBody =
    documented.body.trim() === '' ? undefined : parseJson(documented.body, 'The documented body');
  let actualBody: unknown;
  if (documentedBody !== undefined) {
    try {
      actualBody = normaliseJson(documentedBody, JSON.parse(actual.body), captures);
    } catch {
      actualBody = actual.body;
    }
  }
  return {
    documented: { status: documented.status, headers: documented.headers, body: documentedBody },
    actual: { status: actual.status, headers, body: actualBody },
  };
}
