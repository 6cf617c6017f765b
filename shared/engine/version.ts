/** Version of the engine stored with every assessment, so a stored figure can be re-run and compared. */
export const ENGINE_VERSION = '0.4.0'
