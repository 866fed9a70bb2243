// catalogue stage: built-in example area sets, from an invented teaching-lab scenario (demo data only).
//
// Scenario (invented for lather's demos): a teaching lab blows soap bubbles into the 1 mm gap between
// two acrylic plates from two syringes. The small syringe gives cells of 1 mm^2, the large one cells of
// 2.5 mm^2; the class asks which clusters to expect and which one should win.

/** A named set of areas with what it stands for. */
export interface AreaExample {
  name: string;
  areas: number[];
  description: string;
}

/** The built-in examples, in the order `lather rank --example` lists them. */
export const EXAMPLES: readonly AreaExample[] = [
  { name: 'tray-pair', areas: [1, 2.5], description: 'one small and one large bubble (mm^2)' },
  { name: 'tray-trio', areas: [1, 1, 2.5], description: 'two small bubbles and a large one' },
  { name: 'tray-mixed', areas: [1, 1, 1, 2.5, 2.5], description: 'three small and two large bubbles' },
  { name: 'tray-six', areas: [1, 1, 1, 1, 2.5, 2.5], description: 'four small and two large bubbles' },
];

/** The example called `name`, or undefined. */
export function findExample(name: string): AreaExample | undefined {
  return EXAMPLES.find((e) => e.name === name);
}
