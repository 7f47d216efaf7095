/**
 * True for faults of a service rather than of the data: a database, storage or queue that
 * cannot be reached right now. Such work is retried; anything else is reported as is.
 */
export function isTransientFault(error: unknown): boolean {
  if (!(error instanceof Error)) return false;
  const name = error.name ?? "";
  if (/^Sequelize(Connection|ConnectionRefused|ConnectionTimedOut|HostNotFound|HostNotReachable|ConnectionAcquireTimeout)Error$/.test(name))
    return true;
  if (name === "SequelizeDatabaseError" && /terminating connection|the database system is (starting up|shutting down)/i.test(error.message))
    return true;
  if (name === "TimeoutError" || name === "AbortError") return true;
  const code = (error as { code?: string }).code ?? (error as { original?: { code?: string } }).original?.code ?? "";
  if (["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ENOTFOUND", "EAI_AGAIN", "EHOSTUNREACH", "57P01", "57P03"].includes(code))
    return true;
  const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
  if (status !== undefined && status >= 500) return true;
  if (/Connection is closed|connect ECONNREFUSED|Stream isn't writeable|Reached the max retries/i.test(error.message)) return true;
  const cause = (error as { cause?: unknown }).cause;
  return cause !== undefined && cause !== error && isTransientFault(cause);
}
