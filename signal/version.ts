/** The analysis engine's version, stamped on every result so a saved analysis can be reproduced. */
export const ENGINE_VERSION = '1.7.0';
