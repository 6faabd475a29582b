/**
 * Version of the engine's rules. Bump it whenever a figure the engine produces for the same input
 * changes, so a stored estimate can say which rules made it.
 */
export const ENGINE_VERSION = '1.2.0';
