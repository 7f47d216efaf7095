// The request header in which scripts/serve.mjs hands the app the client address it may
// trust (see scripts/client-address.mjs). Kept in step with CLIENT_ADDRESS_HEADER there.
export const CLIENT_ADDRESS_HEADER = "x-bandkeep-client-address";
