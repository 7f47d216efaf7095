/** Version of the analysis engine; bump when any reported number can change. */
export const ENGINE_VERSION = '1.4.0';
