/**
 * The caution shown wherever results are shown: README, command line, web page, review sheet.
 * Results can be used to decide where people stand; they must say what they are not.
 */
export const CAUTION =
  'Results support, and never replace, the range-safety code that governs the site, the judgement of the ' +
  'responsible safety officer, and local law. They are only as good as the inputs and the model\u2019s limits.';
