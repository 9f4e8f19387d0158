/**
 * conformsToSchema: a quick yes/no on whether a value already is a harness
 * document exactly as schema.ts describes it, without zod's copy of every
 * object. validateDocument asks it first; on "no" it runs the guard and zod,
 * which find and word the problems.
 *
 * So it may refuse what zod would accept (that only costs time) but must
 * never accept what zod or the guard would refuse: anything unusual
 * (an undefined value, a class instance, an inherited key, `__proto__`)
 * answers "no". The tables below mirror schema.ts field by field;
 * tests/shared/conforms.test.ts checks the two agree on random documents.
 */
import { colourPattern, componentIdPattern, MAX_LIST, MAX_TEXT, messageIdPattern, pinIdPattern, pinRefPattern } from './schema';
import { validationLimits } from './limits';

type Check = (v: unknown) => boolean;
interface ObjectSpec {
  fields: Map<string, Check>;
  required: number;
  requiredKeys: ReadonlySet<string>;
}

/** Values seen in this call, against validationLimits.maxValues (the guard's limit). */
let seen = 0;

const isPlain = (v: unknown): v is Record<string, unknown> => {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
};
const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const num: Check = finite;
const nonNeg: Check = (v) => finite(v) && v >= 0;
const positive: Check = (v) => finite(v) && v > 0;
const intIn = (lo: number, hi: number): Check => (v) => finite(v) && Number.isSafeInteger(v) && v >= lo && v <= hi;
const str = (min: number, max: number): Check => (v) => typeof v === 'string' && v.length >= min && v.length <= max;
const matches = (re: RegExp): Check => (v) => typeof v === 'string' && re.test(v);
const literal = (x: unknown): Check => (v) => v === x;
const bool: Check = (v) => typeof v === 'boolean';
const text = str(0, MAX_TEXT);
const componentId = matches(componentIdPattern);
const pinId = matches(pinIdPattern);
const pinRef = matches(pinRefPattern);
const elementId = str(1, 64);

function arrayOf(item: Check, max = MAX_LIST): Check {
  return (v) => {
    if (!Array.isArray(v) || v.length > max) return false;
    seen += v.length;
    if (seen > validationLimits.maxValues) return false;
    for (let i = 0; i < v.length; i++) if (!item(v[i])) return false;
    return true;
  };
}

function recordOf(key: Check, value: Check): Check {
  return (v) => {
    if (!isPlain(v)) return false;
    for (const k in v) {
      if (!Object.prototype.hasOwnProperty.call(v, k) || k === '__proto__') return false;
      seen++;
      if (!key(k) || !value(v[k])) return false;
    }
    return true;
  };
}

function spec(required: Record<string, Check>, optional: Record<string, Check>): ObjectSpec {
  const fields = new Map<string, Check>([...Object.entries(required), ...Object.entries(optional)]);
  return { fields, required: Object.keys(required).length, requiredKeys: new Set(Object.keys(required)) };
}

/** Every key known and its value right (present optional keys included), every required key there. */
function objectMatches(v: unknown, s: ObjectSpec): boolean {
  if (!isPlain(v)) return false;
  let required = 0;
  for (const k in v) {
    if (!Object.prototype.hasOwnProperty.call(v, k)) return false;
    const check = s.fields.get(k);
    seen++;
    if (!check || !check(v[k])) return false;
    if (s.requiredKeys.has(k)) required++;
  }
  return required === s.required && seen <= validationLimits.maxValues;
}

const strictObject = (required: Record<string, Check>, optional: Record<string, Check> = {}): Check => {
  const s = spec(required, optional);
  return (v) => objectMatches(v, s);
};

/** One of several object shapes picked by a field's value, as zod's discriminatedUnion. */
function byField(field: string, shapes: Record<string, Check>): Check {
  const table = new Map(Object.entries(shapes));
  return (v) => {
    if (!isPlain(v)) return false;
    const tag = v[field];
    if (typeof tag !== 'string') return false;
    const check = table.get(tag);
    return check !== undefined && check(v);
  };
}

const freeText = { label: text, function: text, circuit: text, notes: text };
const base = { id: componentId };

const cavity: Check = (v) => (typeof v === 'string' ? pinId(v) : objectMatches(v, cavitySpec));
const cavitySpec = spec({ id: pinId }, freeText);

const pinBase = { id: pinId };
const modulePin = byField('role', {
  supply: strictObject({ ...pinBase, role: literal('supply'), ohms: nonNeg }, freeText),
  ground: strictObject({ ...pinBase, role: literal('ground') }, freeText),
  can_h: strictObject({ ...pinBase, role: literal('can_h') }, { ...freeText, biasOhms: nonNeg }),
  can_l: strictObject({ ...pinBase, role: literal('can_l') }, { ...freeText, biasOhms: nonNeg }),
  output: strictObject({ ...pinBase, role: literal('output'), from: pinId }, { ...freeText, onOhms: nonNeg }),
  ref5: strictObject({ ...pinBase, role: literal('ref5') }, { ...freeText, volts: nonNeg, ohms: nonNeg }),
  input: strictObject({ ...pinBase, role: literal('input') }, { ...freeText, ohms: positive }),
});

const pinPair: Check = (v) => {
  seen += 2;
  return Array.isArray(v) && v.length === 2 && pinId(v[0]) && pinId(v[1]);
};

const component = byField('kind', {
  battery: strictObject({ ...base, kind: literal('battery'), volts: nonNeg }, { ...freeText, internalOhms: nonNeg }),
  ground: strictObject({ ...base, kind: literal('ground') }, { ...freeText, bondOhms: nonNeg }),
  fuse: strictObject({ ...base, kind: literal('fuse'), amps: positive }, { ...freeText, ohms: nonNeg }),
  resistor: strictObject({ ...base, kind: literal('resistor'), ohms: nonNeg }, freeText),
  load: strictObject({ ...base, kind: literal('load') }, { ...freeText, ohms: nonNeg, watts: positive }),
  splice: strictObject({ ...base, kind: literal('splice') }, freeText),
  connector: strictObject(
    { ...base, kind: literal('connector'), cavities: arrayOf(cavity) },
    { ...freeText, matesWith: componentId, contactOhms: nonNeg },
  ),
  switch: strictObject(
    { ...base, kind: literal('switch'), pins: arrayOf(pinId), positions: recordOf(str(1, 64), arrayOf(pinPair)) },
    { ...freeText, contactOhms: nonNeg },
  ),
  relay: strictObject(
    { ...base, kind: literal('relay'), coilOhms: positive },
    { ...freeText, pullInVolts: nonNeg, normallyClosed: bool, contactOhms: nonNeg },
  ),
  module: strictObject({ ...base, kind: literal('module'), pins: arrayOf(modulePin) }, { ...freeText, poweredAboveVolts: nonNeg }),
});

const wireSize: Check = (v) => {
  if (!isPlain(v)) return false;
  return 'mm2' in v ? objectMatches(v, mm2Spec) : objectMatches(v, awgSpec);
};
const mm2Spec = spec({ mm2: positive }, {});
const awgSpec = spec({ awg: intIn(-3, 56) }, {});

const wire = strictObject(
  { id: elementId, from: pinRef, to: pinRef, size: wireSize, lengthM: nonNeg },
  { ...freeText, color: matches(colourPattern), ohms: nonNeg },
);

const clamp = strictObject({ id: elementId, wires: arrayOf(elementId) }, { ...freeText, at: (v) => finite(v) && v >= 0 && v <= 1 });

const state = strictObject(
  { id: elementId, switches: recordOf(componentId, str(1, 64)) },
  { ...freeText, sources: recordOf(componentId, nonNeg), outputs: arrayOf(pinRef), unplugged: arrayOf(componentId) },
);

const signal = strictObject(
  { name: str(1, 200) },
  {
    byte: intIn(0, 7),
    startBit: intIn(0, 511),
    length: intIn(1, 64),
    scale: num,
    offset: num,
    unit: str(0, 64),
    values: recordOf(str(0, 64), text),
    notes: text,
  },
);

const message = strictObject(
  { id: matches(messageIdPattern), extended: bool },
  { sender: componentId, name: str(0, 200), meaning: text, signals: arrayOf(signal, 512), notes: text },
);

const harnessDocument = strictObject(
  {
    format: literal('wirewalk-harness'),
    version: literal(1),
    name: text,
    nominalVolts: positive,
    temperatureC: (v) => finite(v) && v >= -273.15 && v <= 1000,
    components: arrayOf(component),
    wires: arrayOf(wire),
    clamps: arrayOf(clamp),
    states: arrayOf(state),
  },
  { ...freeText, messages: arrayOf(message) },
);

/** True only when zod's harnessDocumentSchema (and the size guard) would accept `input` as it stands. */
export function conformsToSchema(input: unknown): boolean {
  seen = 1;
  try {
    return harnessDocument(input);
  } catch {
    return false; // a getter or proxy that throws: let the full path report it
  }
}
