/** Version of the analysis engine; bump when any reported number can change. */
export const ENGINE_VERSION = '2.1.0';
