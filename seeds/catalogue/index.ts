/**
 * Demo message catalogues by harness key (see ../harnesses/index.ts). A
 * document with its catalogue as the optional `messages` section:
 * `withMessages(doc, key)`.
 */
import type { BusMessage, HarnessDocument } from '../../shared/harness/schema';
import type { DemoHarnessKey } from '../harnesses/index';
import { krT78BusMessages } from './kr-t78-bus';
import { fwM60BusMessages } from './fw-m60-bus';

export { krT78BusMessages, krT78MessagePeriodsMs, auxiliaryControlSignal } from './kr-t78-bus';
export { fwM60BusMessages, fwM60MessagePeriodsMs } from './fw-m60-bus';

export const demoCatalogues: Record<DemoHarnessKey, BusMessage[]> = {
  'kr-t78-main': krT78BusMessages,
  'fw-m60-mulcher': fwM60BusMessages,
  'fw-g72-grapple': [],
  'kr-t78-with-fw-m60': [...krT78BusMessages, ...fwM60BusMessages],
  'kr-t78-with-fw-g72': krT78BusMessages,
};

/** A copy of the document with the catalogue of that harness as its `messages` section. */
export function withMessages(doc: HarnessDocument, key: DemoHarnessKey): HarnessDocument {
  const messages = demoCatalogues[key];
  return messages.length ? { ...doc, messages: structuredClone(messages) } : doc;
}
