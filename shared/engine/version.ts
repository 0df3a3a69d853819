/**
 * The engine's version, stored with every study result so that a re-verification can tell which
 * engine produced a figure. Bump the minor version when any result may move, the major version
 * when a stored result can no longer be read.
 */
export const ENGINE_VERSION = '1.1.0';
