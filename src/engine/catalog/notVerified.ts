/**
 * The words every unverified source string carries, so a reader of a screen or the PDF sees the same
 * caution wherever a value could not be checked against the printed code, standard or table.
 */
export const NOT_VERIFIED = 'not verified against the printed code — confirm against the adopted edition';
