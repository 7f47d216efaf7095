/** Bandkeep's mark: an absorption edge with a bleached first band. */
export function Logo({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect width="32" height="32" rx="7" fill="#d9622b" />
      <path
        d="M4 25 C9 25 10 12 14 12 C17 12 17 18 19 18 C22 18 23 7 28 6"
        fill="none"
        stroke="#fff"
        strokeWidth="2.4"
        strokeLinecap="round"
      />
      <path d="M14 12 C15.5 12 16 15.5 17.5 15.5" fill="none" stroke="#fbe6da" strokeWidth="1.4" strokeDasharray="1.5 1.5" />
    </svg>
  );
}
