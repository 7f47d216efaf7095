/** Version of the analysis engine; bump when any reported number can change. */
export const ENGINE_VERSION = '2.0.0';
