/** Beside every roll-load and flywheel figure (the service's caution says the same of its own figures). */
export const MILL_CAUTION =
  'Hot steel, heavy rolls and the flywheel can kill. These figures are estimates from simple models, ' +
  'an aid to a qualified crew: keep within the stand and engine ratings, and follow the mill’s own ' +
  'limits, local codes and licensed practice.';
