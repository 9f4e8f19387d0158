/**
 * The demo harness documents (contract: ../shared/design/harness-format.md).
 *
 * - `krT78MainHarness`: the loader's main harness and front attachment circuit.
 * - `fwM60MulcherHarness`, `fwG72GrappleHarness`: attachment harnesses, each
 *   with a stand-in for the carrier side of the plug (ids `CAR-…` and X40).
 * - `krT78WithMulcher`, `krT78WithGrapple`: the loader with the attachment
 *   fitted (stand-ins dropped, dust cap off, plug mated).
 * - `krT78MainHarnessDraft`: a draft in progress on top of the published
 *   loader harness (a backup alarm being added).
 */
import type { HarnessDocument } from '../../shared/harness/schema';
import { krT78MainHarness } from './kr-t78-main';
import { fwM60MulcherHarness } from './fw-m60-mulcher';
import { fwG72GrappleHarness } from './fw-g72-grapple';
import { fitAttachment } from './fit';

export { krT78MainHarness } from './kr-t78-main';
export { fwM60MulcherHarness } from './fw-m60-mulcher';
export { fwG72GrappleHarness } from './fw-g72-grapple';
export { fitAttachment, type FitOptions, type FittedState } from './fit';
export { carrierStandIn, isCarrierStandIn } from './carrier';
export { walkThroughFault } from './walk-through';

export const krT78WithMulcher: HarnessDocument = fitAttachment(krT78MainHarness, fwM60MulcherHarness, {
  name: 'KR-T78 with FW-M60 mulcher fitted',
  removeFromMachine: ['XCAP', 'TR2'],
  states: [
    { id: 'key_off', label: 'Key off', machine: 'key_off', attachment: 'key_off' },
    { id: 'key_on', label: 'Key on, engine off', machine: 'key_on', attachment: 'key_on' },
    { id: 'running', label: 'Engine running, rotor off', machine: 'running', attachment: 'running' },
    { id: 'running_rotor', label: 'Engine running, auxiliary flow forward, rotor on', machine: 'running_aux', attachment: 'running_rotor' },
    { id: 'running_rotor_high', label: 'Engine running, rotor on, high-torque range', machine: 'running_aux', attachment: 'running_rotor_high' },
    { id: 'key_off_x30_apart', label: 'Key off, lift-arm connector X30 apart', machine: 'key_off_x30_apart', attachment: 'key_off' },
    { id: 'key_off_unplugged', label: 'Key off, attachment plug apart', machine: 'key_off', attachment: 'key_off_unplugged' },
  ],
});

export const krT78WithGrapple: HarnessDocument = fitAttachment(krT78MainHarness, fwG72GrappleHarness, {
  name: 'KR-T78 with FW-G72 grapple fitted',
  removeFromMachine: ['XCAP', 'TR2'],
  states: [
    { id: 'key_off', label: 'Key off', machine: 'key_off', attachment: 'key_off' },
    { id: 'key_on', label: 'Key on, engine off', machine: 'key_on', attachment: 'key_on' },
    { id: 'running', label: 'Engine running', machine: 'running', attachment: 'running' },
    { id: 'running_aux', label: 'Engine running, auxiliary flow forward (grapple cylinders)', machine: 'running_aux', attachment: 'running' },
    { id: 'running_tine', label: 'Engine running, independent tine selected (output A on)', machine: 'running_output_a', attachment: 'running_tine' },
    { id: 'key_off_x30_apart', label: 'Key off, lift-arm connector X30 apart', machine: 'key_off_x30_apart', attachment: 'key_off' },
    { id: 'key_off_unplugged', label: 'Key off, attachment plug apart', machine: 'key_off', attachment: 'key_off_unplugged' },
  ],
});

/** A draft in progress on the published loader harness: a backup alarm on the reverse output, not finished. */
export const krT78MainHarnessDraft: HarnessDocument = (() => {
  const doc = structuredClone(krT78MainHarness);
  doc.notes = `${doc.notes} Draft: adding the backup alarm fitted on units from serial KRT78K10300 (not yet checked on a machine).`;
  doc.components.push({ id: 'BA1', kind: 'load', label: 'Backup alarm, rear counterweight (draft: rating to confirm)', watts: 6 });
  const mcu = doc.components.find((c) => c.id === 'MCU');
  if (mcu?.kind === 'module') mcu.pins.push({ id: '23', role: 'output', from: '3', function: 'Backup alarm driver, reverse travel (draft)' });
  doc.wires.push(
    { id: 'W128', from: 'MCU.23', to: 'BA1.1', color: 'GY', size: { mm2: 0.75 }, lengthM: 3.1, circuit: '134', label: 'Backup alarm feed (draft: confirm the driver pin)' },
    { id: 'W129', from: 'BA1.2', to: 'SP10.S', color: 'BK', size: { mm2: 0.75 }, lengthM: 1.2, circuit: '904', label: 'Backup alarm ground' },
  );
  return doc;
})();

export type DemoHarnessKey = 'kr-t78-main' | 'fw-m60-mulcher' | 'fw-g72-grapple' | 'kr-t78-with-fw-m60' | 'kr-t78-with-fw-g72';

/** Every published demo document by key (the library links models to these keys). */
export const demoHarnesses: Record<DemoHarnessKey, HarnessDocument> = {
  'kr-t78-main': krT78MainHarness,
  'fw-m60-mulcher': fwM60MulcherHarness,
  'fw-g72-grapple': fwG72GrappleHarness,
  'kr-t78-with-fw-m60': krT78WithMulcher,
  'kr-t78-with-fw-g72': krT78WithGrapple,
};
