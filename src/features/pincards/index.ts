/**
 * Pin cards, walks, readings and suspects: the tech's side. Public surface:
 * - route modules (registered in src/app/routes.ts): `/pin-cards` (find a connector),
 *   `/pin-cards/:harnessId/:revisionId/:connectorId` (a pin card; `latest` as the revision
 *   opens the latest published one), `/walk?revision=&from=&to=&state=`; all take `?order=ID`
 *   so readings are saved against that repair order;
 * - `cardPath`, `walkPath`, `findPath` to link to them.
 */
export { cardPath, walkPath, findPath } from './paths';
