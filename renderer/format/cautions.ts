/** The usual caution, one line, the same wherever results are shown (the report and the command line carry their own copy). */
export const RESULTS_CAUTION =
  'Results are an engineering aid: verify on the real part (for example an impact test) and defer to local codes and licensed engineering practice.'
