/**
 * A component's pin ids, apart from schema.ts so that pages which must stay small
 * (the pin card) can use them without pulling zod in: only types come from the schema.
 */
import type { Component } from './schema';

/** The ids of a component's pins in order, per the contract's table. */
export function componentPinIds(c: Component): string[] {
  switch (c.kind) {
    case 'battery': return ['+', '-'];
    case 'ground': return ['G'];
    case 'fuse': case 'resistor': case 'load': return ['1', '2'];
    case 'splice': return ['S'];
    case 'connector': return c.cavities.map((cv) => (typeof cv === 'string' ? cv : cv.id));
    case 'switch': return [...c.pins];
    case 'relay': return c.normallyClosed ? ['85', '86', '30', '87', '87a'] : ['85', '86', '30', '87'];
    case 'module': return c.pins.map((p) => p.id);
  }
}
