/**
 * Bus messages: the catalogue of what each controller sends, captures, compare and findings.
 * Public surface:
 * - route module `pages/BusPage` (registered in src/app/routes.ts): `/bus` and `/bus/:harnessId`;
 * - `BusMessagesForPin` for the pin card of a bus cavity (props: revisionId, document, pinRef,
 *   optional onMessageReading and seen), renders nothing for a pin not on a bus.
 */
export { BusMessagesForPin, type BusMessagesForPinProps, type MessageObservation } from './components/BusMessagesForPin';
export const busPath = (harnessId?: string) => (harnessId ? `/bus/${harnessId}` : '/bus');
