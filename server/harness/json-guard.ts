/**
 * A look at raw JSON before it is parsed: parsing a hostile body (millions of nested
 * brackets) takes seconds of the one thread every request shares, so nesting depth is
 * counted first, byte by byte, in one pass, and a body that is too deep is refused at once.
 */
import { HttpError } from '../errors';

/** Deeper than any harness document needs (the validator itself allows 24). */
export const MAX_JSON_DEPTH = 64;

/** The depth reached if it passes `maxDepth`, else null. Strings (and escapes in them) are skipped. */
export function jsonTooDeep(buf: Uint8Array, maxDepth = MAX_JSON_DEPTH): number | null {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < buf.length; i++) {
    const c = buf[i];
    if (inString) {
      if (c === 0x5c) i++; // backslash: skip the escaped byte
      else if (c === 0x22) inString = false;
      continue;
    }
    if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      depth++;
      if (depth > maxDepth) return depth;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return null;
}

export function refuseDeepJson(buf: Uint8Array): void {
  if (jsonTooDeep(buf) !== null) {
    throw new HttpError(422, 'invalid_document', `The document is nested deeper than ${MAX_JSON_DEPTH} levels; a harness document never is.`, [
      { path: '$', message: `Nested deeper than ${MAX_JSON_DEPTH} levels` },
    ]);
  }
}

/** Parses an uploaded file's bytes as JSON, or answers 400/422 saying what is wrong. */
export function parseJsonUpload(buf: Buffer): unknown {
  refuseDeepJson(buf);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buf);
  } catch {
    throw new HttpError(400, 'invalid_json', 'The file is not UTF-8 text; upload the harness document as a .json file.');
  }
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (err) {
    throw new HttpError(400, 'invalid_json', `The file is not valid JSON: ${(err as Error).message}`);
  }
}
