/**
 * Version of the lint engine. Bump it whenever a rule's logic or message changes, so
 * findings stored for an unchanged asset are not reused across engine versions.
 */
export const ENGINE_VERSION = '1.0.0';
