/** Short texts the maintenance screens share. */
export const DUE_RULE_HINT =
  'Due when any interval (running hours, revolutions, calendar days) is reached, whichever comes ' +
  'first; coming due with 10 % or less left or within 7 days; overrun once one is reached.';
