import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CaptureSummariser, MAX_LINE_LENGTH, parseCandumpLine, summariseCandump } from '../../shared/can/candump';

function frame(line: string) {
  const r = parseCandumpLine(line, 1);
  if (r.kind !== 'frame') throw new Error(`expected a frame, got ${JSON.stringify(r)}`);
  return r.frame;
}

function reason(line: string): string {
  const r = parseCandumpLine(line, 7);
  if (r.kind !== 'bad') throw new Error(`expected a bad line, got ${JSON.stringify(r)}`);
  expect(r.lineNo).toBe(7);
  return r.reason;
}

describe('parseCandumpLine', () => {
  it('reads the published example line (SocketCAN can-utils candump -l format)', () => {
    const f = frame('(1700000000.123456) can0 18FEF100#FFFFFF3C00FFFFFF');
    expect(f.time).toBeCloseTo(1700000000.123456, 6);
    expect(f).toMatchObject({ iface: 'can0', id: 0x18fef100, extended: true, remote: false, fd: false, length: 8 });
    expect(f.data).toEqual([0xff, 0xff, 0xff, 0x3c, 0x00, 0xff, 0xff, 0xff]);
  });

  it('tells 11-bit from 29-bit identifiers by digit count (can-utils: 3 digits base, 8 extended)', () => {
    expect(frame('(1.0) can0 123#01')).toMatchObject({ id: 0x123, extended: false });
    expect(frame('(1.0) can0 00000123#01')).toMatchObject({ id: 0x123, extended: true });
    expect(frame('(1.0) can0 7FF#')).toMatchObject({ id: 0x7ff, extended: false, length: 0, data: [] });
    expect(frame('(1.0) can0 1fffffff#aa')).toMatchObject({ id: 0x1fffffff, extended: true, data: [0xaa] });
  });

  it('reads remote frames, with and without a length (can-utils R / R<len>)', () => {
    expect(frame('(1.5) vcan1 123#R')).toMatchObject({ remote: true, length: 0, data: [] });
    expect(frame('(1.5) vcan1 18EA00FE#R3')).toMatchObject({ remote: true, length: 3, extended: true });
    expect(reason('(1.5) can0 123#R9')).toMatch(/remote/);
    expect(reason('(1.5) can0 123#R12')).toMatch(/remote/);
  });

  it('parses CAN FD lines (##, flags digit, FD lengths) rather than refusing them', () => {
    const data = '00'.repeat(12);
    expect(frame(`(2.0) can0 123##1${data}`)).toMatchObject({ fd: true, fdFlags: 1, length: 12 });
    expect(frame('(2.0) can0 18FEF100##0').length).toBe(0);
    expect(frame(`(2.0) can0 123##0${'AB'.repeat(64)}`).length).toBe(64);
    expect(reason(`(2.0) can0 123##0${'00'.repeat(9)}`)).toMatch(/not a CAN FD length/);
    expect(reason(`(2.0) can0 123##0${'00'.repeat(65)}`)).toMatch(/64/);
    expect(reason('(2.0) can0 123##')).toMatch(/flags/);
    expect(reason('(2.0) can0 123##G00')).toMatch(/flags/);
    expect(reason('(2.0) can0 123###0011')).toMatch(/XL/);
  });

  it('accepts dot separators and the raw-DLC suffix (can-utils formats)', () => {
    expect(frame('(1.0) can0 123#11.22.33').data).toEqual([0x11, 0x22, 0x33]);
    expect(frame('(1.0) can0 123#1122334455667788_C').length).toBe(8);
    expect(reason('(1.0) can0 123#1122_C')).toMatch(/_/);
    expect(reason('(1.0) can0 123#1122334455667788_5')).toMatch(/_/);
    expect(reason('(1.0) can0 123#.11')).toMatch(/'\.'/);
    expect(reason('(1.0) can0 123#11..22')).toMatch(/'\.'/);
    expect(reason('(1.0) can0 123#11.')).toMatch(/'\.'/);
  });

  it('tolerates extra spaces, tabs, CRLF and a trailing direction letter', () => {
    expect(frame('   (1.000001)\t can0    123#0102   ').data).toEqual([1, 2]);
    expect(frame('(1.000001) can0 123#0102\r').data).toEqual([1, 2]);
    expect(frame('(1.000001) can0 123#0102 R').id).toBe(0x123);
    expect(frame('(1.000001) can0 123#0102 T').id).toBe(0x123);
    expect(frame('(17) can0 123#01').time).toBe(17);
  });

  it('skips blank lines and # notes', () => {
    expect(parseCandumpLine('', 3)).toEqual({ kind: 'blank', lineNo: 3 });
    expect(parseCandumpLine(' \t\r', 4)).toEqual({ kind: 'blank', lineNo: 4 });
    expect(parseCandumpLine('# boom raised, engine off', 5)).toEqual({ kind: 'comment', lineNo: 5 });
  });

  it('reports bad hex, wrong lengths and missing parts with a reason', () => {
    expect(reason('(1.0) can0 12G#01')).toMatch(/identifier is not hex/);
    expect(reason('(1.0) can0 1234#01')).toMatch(/3 hex digits/);
    expect(reason('(1.0) can0 12#01')).toMatch(/3 hex digits/);
    expect(reason('(1.0) can0 #01')).toMatch(/3 hex digits/);
    expect(reason('(1.0) can0 800#01')).toMatch(/above 7FF/);
    expect(reason('(1.0) can0 20000080#0000000000000000')).toMatch(/error frame/);
    expect(reason('(1.0) can0 FFFFFFFF#00')).toMatch(/beyond 29 bits/);
    expect(reason('(1.0) can0 123#0G')).toMatch(/data is not hex/);
    expect(reason('(1.0) can0 123#012')).toMatch(/odd number/);
    expect(reason('(1.0) can0 123#010203040506070809')).toMatch(/more than 8/);
    expect(reason('(1.0) can0 123')).toMatch(/'#'/);
    expect(reason('(1.0) can0')).toMatch(/missing frame/);
    expect(reason('(1.0) 123#01')).toMatch(/missing interface/);
    expect(reason('(1.0)')).toMatch(/missing interface and frame/);
    expect(reason('(1.0)can0 123#01')).toMatch(/space after the timestamp/);
    expect(reason('can0 123#01')).toMatch(/timestamp in parentheses/);
    expect(reason('(abc) can0 123#01')).toMatch(/not a number/);
    expect(reason('(.5) can0 123#01')).toMatch(/not a number/);
    expect(reason('(1.0 can0 123#01')).toMatch(/closing parenthesis/);
    expect(reason('(1.0) can0 123#01 extra words')).toMatch(/after the frame/);
    expect(reason('hello world')).toMatch(/timestamp/);
  });

  it('refuses a huge line quickly, keeping only the start of it for the report', () => {
    const huge = '(1.0) can0 123#' + '0'.repeat(1_000_000);
    const r = parseCandumpLine(huge, 9);
    expect(r).toMatchObject({ kind: 'bad', lineNo: 9, reason: `line longer than ${MAX_LINE_LENGTH} characters` });
    expect(r.kind === 'bad' && r.text.length).toBe(80);
  });

  it('never throws, and answers one of the four kinds, for arbitrary text (property)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 200 }), fc.nat(), (s, n) => {
      const r = parseCandumpLine(s, n);
      return ['frame', 'blank', 'comment', 'bad'].includes(r.kind) && r.lineNo === n;
    }), { numRuns: 2000 });
  });

  it('never throws on near-miss lines built from log alphabet (property)', () => {
    const alphabet = fc.constantFrom(...'()#.Rr_ \t\r0123456789abcdefABCDEFGxcan'.split(''));
    fc.assert(fc.property(fc.array(alphabet, { maxLength: 60 }).map((a) => a.join('')), (tail) => {
      const r = parseCandumpLine('(1.0) can0 ' + tail, 1);
      if (r.kind === 'frame') return r.frame.data.length === (r.frame.remote ? 0 : r.frame.length) && r.frame.data.every((b) => b >= 0 && b <= 255);
      return true;
    }), { numRuns: 3000 });
  });

  it('reads back what it would write for any classic frame (property)', () => {
    fc.assert(fc.property(
      fc.boolean(), fc.integer({ min: 0, max: 0x1fffffff }), fc.uint8Array({ maxLength: 8 }),
      (ext, rawId, bytes) => {
        const id = ext ? rawId : rawId & 0x7ff;
        const idText = id.toString(16).padStart(ext ? 8 : 3, '0');
        const dataText = Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
        const f = frame(`(1700000000.000001) can0 ${idText}#${dataText}`);
        return f.id === id && f.extended === ext && f.data.join() === Array.from(bytes).join();
      },
    ));
  });
});

describe('CaptureSummariser', () => {
  // An invented capture: 0C000010 (29-bit) at 10 Hz, 321 (11-bit) at 2 Hz.
  function invented(): string {
    const out: string[] = [];
    for (let i = 0; i < 50; i++) {
      const t = (1000 + i * 0.1).toFixed(6);
      out.push(`(${t}) can0 0C000010#${(i % 4).toString(16).padStart(2, '0')}AA00`);
      if (i % 5 === 0) out.push(`(${t}) can0 321#${i < 25 ? '00' : 'FF'}`);
    }
    return out.join('\n') + '\n';
  }

  it('counts identifiers, times, rate, length and byte values', () => {
    const s = summariseCandump(invented());
    expect(s.lines).toBe(60);
    expect(s.frames).toBe(60);
    expect(s.badLineCount).toBe(0);
    expect(s.interfaces).toEqual([{ name: 'can0', frames: 60 }]);
    expect(s.identifiers.map((x) => x.key)).toEqual(['321', '0C000010']);
    const a = s.identifiers[1];
    expect(a).toMatchObject({ count: 50, length: 3, lengths: [{ length: 3, count: 50 }], firstTime: 1000 });
    expect(a.lastTime).toBeCloseTo(1004.9, 6);
    expect(a.rateHz).toBeCloseTo(10, 6);
    expect(a.j1939).toMatchObject({ priority: 3, pgn: 0, destination: 0x00, source: 0x10 });
    expect(a.bytes[0]).toEqual({ index: 0, count: 50, min: 0, max: 3, distinct: [
      { value: 0, count: 13 }, { value: 1, count: 13 }, { value: 2, count: 12 }, { value: 3, count: 12 }] });
    expect(a.bytes[1]).toMatchObject({ min: 0xaa, max: 0xaa, distinct: [{ value: 0xaa, count: 50 }] });
    const b = s.identifiers[0];
    expect(b).toMatchObject({ count: 10, extended: false, j1939: null, length: 1 });
    expect(b.rateHz).toBeCloseTo(9 / 4.5, 6);
    expect(b.bytes[0].distinct).toEqual([{ value: 0, count: 5 }, { value: 0xff, count: 5 }]);
  });

  it('gives the same result however the text is cut into chunks (property)', () => {
    const text = invented() + 'garbage\n\n# note\r\n(1.0) can0 123#R\n(1.1) can0 123#0102';
    const whole = summariseCandump(text);
    expect(whole.badLineCount).toBe(1);
    expect(whole.badLines).toEqual([{ lineNo: 61, reason: 'expected a timestamp in parentheses at the start', text: 'garbage' }]);
    expect(whole.blankLines).toBe(1);
    expect(whole.commentLines).toBe(1);
    fc.assert(fc.property(fc.array(fc.nat({ max: text.length }), { maxLength: 12 }), (cuts) => {
      const points = [...new Set(cuts)].sort((x, y) => x - y);
      const s = new CaptureSummariser();
      let prev = 0;
      for (const p of points) { s.addChunk(text.slice(prev, p)); prev = p; }
      s.addChunk(text.slice(prev));
      expect(s.result()).toEqual(whole);
    }), { numRuns: 200 });
  });

  it('numbers lines the same when fed line by line', () => {
    const s = new CaptureSummariser();
    for (const l of ['(1.0) can0 123#01', '', 'bad', '(1.2) can0 123#02']) s.addLine(l);
    const r = s.result();
    expect(r.lines).toBe(4);
    expect(r.badLines[0].lineNo).toBe(3);
    expect(r.identifiers[0].bytes[0].distinct.length).toBe(2);
  });

  it('counts remote and FD frames apart, without byte values for remote ones', () => {
    const s = summariseCandump('(1.0) can0 123#R2\n(2.0) can0 123#0A0B\n(3.0) can0 123##1' + '01'.repeat(12) + '\n');
    const x = s.identifiers[0];
    expect(x).toMatchObject({ count: 3, remoteCount: 1, fdCount: 1, lengths: [{ length: 2, count: 1 }, { length: 12, count: 1 }] });
    expect(x.bytes.map((b) => b.count)).toEqual([2, 2, ...Array(10).fill(1)]);
    expect(x.rateHz).toBeCloseTo(1, 9);
  });

  it('gives no rate for a single frame or frames at one instant', () => {
    const s = summariseCandump('(5.0) can0 123#01\n(6.0) can0 456#01\n(6.0) can0 456#02\n');
    expect(s.identifiers.map((x) => x.rateHz)).toEqual([null, null]);
  });

  it('keeps the first 100 bad lines but counts them all', () => {
    const lines = Array.from({ length: 250 }, (_, i) => (i % 2 ? `(1.${i}) can0 123#01` : `junk ${i}`));
    const s = summariseCandump(lines.join('\r\n'));
    expect(s.badLineCount).toBe(125);
    expect(s.badLines.length).toBe(100);
    expect(s.badLines[0].lineNo).toBe(1);
    expect(s.badLines[99].lineNo).toBe(199);
    expect(s.frames).toBe(125);
  });

  it('reports a huge line split over many chunks once, holding only its start', () => {
    const s = new CaptureSummariser();
    s.addChunk('(1.0) can0 123#01\n(2.0) can0 123#');
    for (let i = 0; i < 1000; i++) s.addChunk('00'.repeat(500));
    s.addChunk('\n(3.0) can0 123#02\n');
    const r = s.result();
    expect(r.lines).toBe(3);
    expect(r.badLines).toEqual([{ lineNo: 2, reason: `line longer than ${MAX_LINE_LENGTH} characters`, text: '(2.0) can0 123#' + '0'.repeat(65) }]);
    expect(r.identifiers[0].count).toBe(2);
  });

  it('reads a last line without a newline at the end', () => {
    const s = new CaptureSummariser();
    s.addChunk('(1.0) can0 123#01\n(2.0) can0 12');
    s.addChunk('3#02');
    expect(s.result().identifiers[0].count).toBe(2);
  });

  it('bounds memory by distinct identifiers, counting frames it could not hold', () => {
    const lines = Array.from({ length: 30 }, (_, i) => `(1.0) can0 ${(0x100 + i).toString(16)}#01`);
    const s = summariseCandump(lines.join('\n'), { maxIdentifiers: 10 });
    expect(s.identifiers.length).toBe(10);
    expect(s.droppedFrames).toBe(20);
    expect(s.frames).toBe(30);
  });

  it('holds every byte value 0x00–0xFF, no more (256 distinct values)', () => {
    const lines = Array.from({ length: 600 }, (_, i) => `(${i}.0) can0 123#${(i % 256).toString(16).padStart(2, '0')}`);
    const b = summariseCandump(lines.join('\n')).identifiers[0].bytes[0];
    expect(b.distinct.length).toBe(256);
    expect([b.min, b.max]).toEqual([0, 255]);
    expect(b.distinct.reduce((n, d) => n + d.count, 0)).toBe(600);
  });

  it('ignores non-text input without throwing', () => {
    const s = new CaptureSummariser();
    s.addChunk(undefined as unknown as string);
    s.addLine(42 as unknown as string);
    expect(s.result()).toMatchObject({ lines: 1, frames: 0, blankLines: 1, firstTime: null, lastTime: null });
    expect(summariseCandump(null as unknown as string).lines).toBe(0);
  });

  it('never throws on arbitrary chunks (property)', () => {
    fc.assert(fc.property(fc.array(fc.string({ maxLength: 80 }), { maxLength: 20 }), (chunks) => {
      const s = new CaptureSummariser();
      for (const c of chunks) s.addChunk(c);
      const r = s.result();
      return r.lines >= 0 && r.frames + r.badLineCount + r.blankLines + r.commentLines === r.lines;
    }), { numRuns: 500 });
  });
});
