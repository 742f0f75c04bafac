/** Shown beside every result set and in every export. */
export const SIMULATION_CAUTION =
  'Results depend on the interaction potential, the system size and how well the trajectory samples the state. ' +
  'A simulation is a model: it is not a substitute for experiment, nor for licensed engineering practice where safety decisions are made.';
