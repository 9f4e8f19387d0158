/**
 * The harness document, version 1 (see design/harness-format.md).
 *
 * Every object is strict: an unknown field is a problem. Optional fields get
 * no default here (a round trip must give back exactly what came in); the
 * engine applies the contract's defaults when it builds the circuit.
 */
import { z } from 'zod';

export const componentIdPattern = /^[A-Za-z0-9_-]{1,32}$/;
export const pinIdPattern = /^[A-Za-z0-9_+-]{1,16}$/;
/** `COMPONENT.PIN`, e.g. `X12.3`, `BATT.+`. */
export const pinRefPattern = /^[A-Za-z0-9_-]{1,32}\.[A-Za-z0-9_+-]{1,16}$/;

/** IEC 60757 letter codes. */
export const colourCodes = ['BK', 'BN', 'RD', 'OG', 'YE', 'GN', 'BU', 'VT', 'GY', 'WH', 'PK', 'GD', 'TQ', 'SR', 'GNYE'] as const;
const colourAlt = colourCodes.join('|');
/** A base colour, optionally a stripe after a slash: `RD`, `RD/WH`. */
export const colourPattern = new RegExp(`^(${colourAlt})(/(${colourAlt}))?$`);

/** Longest free text and longest list the schema allows (conforms.ts mirrors them). */
export const MAX_TEXT = 4000;
export const MAX_LIST = 200_000;

const text = z.string().max(MAX_TEXT);
const componentId = z.string().regex(componentIdPattern, 'Use 1 to 32 letters, digits, "_" or "-"');
const pinId = z.string().regex(pinIdPattern, 'Use 1 to 16 letters, digits, "_", "+" or "-"');
/** Wire, clamp and state ids: the contract restricts only component and pin ids; any short text. */
const elementId = z.string().min(1).max(64);
const pinRef = z.string().regex(pinRefPattern, 'Refer to a pin as COMPONENT.PIN, e.g. X12.3');
const num = z.number();
const nonNeg = z.number().nonnegative();
const positive = z.number().positive();

/** Free-text fields allowed on every object of the document. */
const freeText = {
  label: text.optional(),
  function: text.optional(),
  circuit: text.optional(),
  notes: text.optional(),
};

const base = { id: componentId, ...freeText };

export const batterySchema = z.strictObject({ ...base, kind: z.literal('battery'), volts: nonNeg, internalOhms: nonNeg.optional() });
export const groundSchema = z.strictObject({ ...base, kind: z.literal('ground'), bondOhms: nonNeg.optional() });
export const fuseSchema = z.strictObject({ ...base, kind: z.literal('fuse'), amps: positive, ohms: nonNeg.optional() });
export const resistorSchema = z.strictObject({ ...base, kind: z.literal('resistor'), ohms: nonNeg });
export const loadSchema = z.strictObject({ ...base, kind: z.literal('load'), ohms: nonNeg.optional(), watts: positive.optional() });
export const spliceSchema = z.strictObject({ ...base, kind: z.literal('splice') });

export const cavitySchema = z.union([pinId, z.strictObject({ id: pinId, ...freeText })]);
export const connectorSchema = z.strictObject({
  ...base,
  kind: z.literal('connector'),
  cavities: z.array(cavitySchema).max(MAX_LIST),
  matesWith: componentId.optional(),
  contactOhms: nonNeg.optional(),
});

export const switchSchema = z.strictObject({
  ...base,
  kind: z.literal('switch'),
  pins: z.array(pinId).max(MAX_LIST),
  positions: z.record(z.string().min(1).max(64), z.array(z.tuple([pinId, pinId])).max(MAX_LIST)),
  contactOhms: nonNeg.optional(),
});

export const relaySchema = z.strictObject({
  ...base,
  kind: z.literal('relay'),
  coilOhms: positive,
  pullInVolts: nonNeg.optional(),
  normallyClosed: z.boolean().optional(),
  contactOhms: nonNeg.optional(),
});

const pinBase = { id: pinId, ...freeText };
export const modulePinSchema = z.discriminatedUnion('role', [
  z.strictObject({ ...pinBase, role: z.literal('supply'), ohms: nonNeg }),
  z.strictObject({ ...pinBase, role: z.literal('ground') }),
  z.strictObject({ ...pinBase, role: z.literal('can_h'), biasOhms: nonNeg.optional() }),
  z.strictObject({ ...pinBase, role: z.literal('can_l'), biasOhms: nonNeg.optional() }),
  z.strictObject({ ...pinBase, role: z.literal('output'), from: pinId, onOhms: nonNeg.optional() }),
  z.strictObject({ ...pinBase, role: z.literal('ref5'), volts: nonNeg.optional(), ohms: nonNeg.optional() }),
  z.strictObject({ ...pinBase, role: z.literal('input'), ohms: positive.optional() }),
]);
export const moduleSchema = z.strictObject({
  ...base,
  kind: z.literal('module'),
  pins: z.array(modulePinSchema).max(MAX_LIST),
  poweredAboveVolts: nonNeg.optional(),
});

export const componentSchema = z.discriminatedUnion('kind', [
  batterySchema,
  groundSchema,
  fuseSchema,
  resistorSchema,
  loadSchema,
  spliceSchema,
  connectorSchema,
  switchSchema,
  relaySchema,
  moduleSchema,
]);

export const wireSizeSchema = z.union([
  z.strictObject({ mm2: positive }),
  z.strictObject({ awg: z.number().int().min(-3).max(56) }),
]);

export const wireSchema = z.strictObject({
  id: elementId,
  from: pinRef,
  to: pinRef,
  color: z.string().regex(colourPattern, 'Use IEC 60757 letter codes, e.g. RD or RD/WH').optional(),
  size: wireSizeSchema,
  lengthM: nonNeg,
  ohms: nonNeg.optional(),
  ...freeText,
});

export const clampSchema = z.strictObject({
  id: elementId,
  wires: z.array(elementId).max(MAX_LIST),
  at: z.number().min(0).max(1).optional(),
  ...freeText,
});

export const stateSchema = z.strictObject({
  id: elementId,
  switches: z.record(componentId, z.string().min(1).max(64)),
  sources: z.record(componentId, nonNeg).optional(),
  outputs: z.array(pinRef).max(MAX_LIST).optional(),
  unplugged: z.array(componentId).max(MAX_LIST).optional(),
  ...freeText,
});

/** Hex identifier: 11-bit (up to 3 digits) or 29-bit (up to 8 digits). */
export const messageIdPattern = /^(0x)?[0-9A-Fa-f]{1,8}$/;

export const messageSignalSchema = z.strictObject({
  name: z.string().min(1).max(200),
  byte: z.number().int().min(0).max(7).optional(),
  startBit: z.number().int().min(0).max(511).optional(),
  length: z.number().int().min(1).max(64).optional(),
  scale: num.optional(),
  offset: num.optional(),
  unit: z.string().max(64).optional(),
  values: z.record(z.string().max(64), z.string().max(MAX_TEXT)).optional(),
  notes: text.optional(),
});

export const messageSchema = z.strictObject({
  id: z.string().regex(messageIdPattern, 'Use a hex identifier like 18FEF100 or 1A0'),
  extended: z.boolean(),
  sender: componentId.optional(),
  name: z.string().max(200).optional(),
  meaning: text.optional(),
  signals: z.array(messageSignalSchema).max(512).optional(),
  notes: text.optional(),
});

export const harnessDocumentSchema = z.strictObject({
  format: z.literal('wirewalk-harness'),
  version: z.literal(1),
  name: z.string().max(MAX_TEXT),
  nominalVolts: positive,
  temperatureC: z.number().min(-273.15).max(1000),
  components: z.array(componentSchema).max(MAX_LIST),
  wires: z.array(wireSchema).max(MAX_LIST),
  clamps: z.array(clampSchema).max(MAX_LIST),
  states: z.array(stateSchema).max(MAX_LIST),
  messages: z.array(messageSchema).max(MAX_LIST).optional(),
  label: text.optional(),
  function: text.optional(),
  circuit: text.optional(),
  notes: text.optional(),
});

export type HarnessDocument = z.infer<typeof harnessDocumentSchema>;
export type Component = z.infer<typeof componentSchema>;
export type ComponentKind = Component['kind'];
export type BatteryComponent = z.infer<typeof batterySchema>;
export type GroundComponent = z.infer<typeof groundSchema>;
export type FuseComponent = z.infer<typeof fuseSchema>;
export type ResistorComponent = z.infer<typeof resistorSchema>;
export type LoadComponent = z.infer<typeof loadSchema>;
export type SpliceComponent = z.infer<typeof spliceSchema>;
export type ConnectorComponent = z.infer<typeof connectorSchema>;
export type SwitchComponent = z.infer<typeof switchSchema>;
export type RelayComponent = z.infer<typeof relaySchema>;
export type ModuleComponent = z.infer<typeof moduleSchema>;
export type ModulePin = z.infer<typeof modulePinSchema>;
export type ModulePinRole = ModulePin['role'];
export type Cavity = z.infer<typeof cavitySchema>;
export type Wire = z.infer<typeof wireSchema>;
export type WireSize = z.infer<typeof wireSizeSchema>;
export type Clamp = z.infer<typeof clampSchema>;
export type HarnessState = z.infer<typeof stateSchema>;
export type BusMessage = z.infer<typeof messageSchema>;
export type BusSignal = z.infer<typeof messageSignalSchema>;

export const componentKinds: readonly ComponentKind[] = [
  'battery', 'ground', 'fuse', 'resistor', 'load', 'splice', 'connector', 'switch', 'relay', 'module',
];

export { componentPinIds } from './pins';
