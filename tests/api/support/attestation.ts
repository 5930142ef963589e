/** The preparer's attestation every issue carries (an invented name and licence number). */
export const ATTESTATION = { name: 'Dana Whitlow', licenceNumber: 'PE 40417', basis: 'prepared', confirmed: true } as const;
