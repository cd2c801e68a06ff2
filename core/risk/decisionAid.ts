/**
 * Shown wherever a Pc or tier could inform a manoeuvre decision. A file of its own so that the
 * renderer can show it without bundling the risk code (re-exported by assess.ts).
 */
export const DECISION_AID_NOTE =
  'Keepclear results are a decision aid only. Defer to the screening provider\'s conjunction ' +
  'messages, your licensed operating practice and local rules before deciding on any manoeuvre.';
