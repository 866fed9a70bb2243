// catalogue stage: built-in example area sets, from an invented teaching-lab scenario (demo data only).
//
// Scenario (invented for lather's demos): a teaching lab blows soap bubbles into the 1 mm gap between
// two acrylic plates from two syringes. The small syringe gives cells of 1 mm^2, the large one cells of
// 2.5 mm^2; the class asks which clusters to expect and which one should win. In a later session the
// large syringe holds a dyed solution with another surfactant: a film between a plain and a dyed bubble
// is stiffer, its tension (invented) 1.3 times that of a plain film, and the class asks whether the
// dyed bubbles now keep together.

import type { TensionSetting } from '../solver/tensions.ts';

/** A named set of areas with what it stands for (and, for two kinds of cell, their types and tensions). */
export interface AreaExample {
  name: string;
  areas: number[];
  description: string;
  /** A type label per area, when the cells are of different kinds. */
  types?: string[];
  /** Tensions between the types (every pair not listed: 1). */
  tensions?: TensionSetting[];
}

/** The built-in examples, in the order `lather rank --example` lists them. */
export const EXAMPLES: readonly AreaExample[] = [
  { name: 'tray-pair', areas: [1, 2.5], description: 'one small and one large bubble (mm^2)' },
  { name: 'tray-trio', areas: [1, 1, 2.5], description: 'two small bubbles and a large one' },
  { name: 'tray-mixed', areas: [1, 1, 1, 2.5, 2.5], description: 'three small and two large bubbles' },
  { name: 'tray-six', areas: [1, 1, 1, 1, 2.5, 2.5], description: 'four small and two large bubbles' },
  {
    name: 'tray-dyed', areas: [1, 1, 2.5, 2.5], types: ['plain', 'plain', 'dyed', 'dyed'],
    tensions: [{ a: 'plain', b: 'dyed', value: 1.3 }],
    description: 'two small plain bubbles and two large dyed ones; a plain-dyed film has tension 1.3',
  },
];

/** The example called `name`, or undefined. */
export function findExample(name: string): AreaExample | undefined {
  return EXAMPLES.find((e) => e.name === name);
}
