import type { SpeciesEntry } from './display-panel';
import type { SystemSpecies } from './scene/frame-scene';
import { speciesStyle } from './species-style';

/** The display panel's species list: name, atom count, colour and whether it is shown. */
export function speciesEntries(system: SystemSpecies | null, hidden: ReadonlySet<number>): SpeciesEntry[] {
  if (!system) return [];
  const counts = new Array<number>(system.speciesNames.length).fill(0);
  for (const s of system.speciesIndex) counts[s]!++;
  return system.speciesNames.map((name, index) => ({ index, name, count: counts[index]!, colour: speciesStyle(name).colour, visible: !hidden.has(index) }));
}
