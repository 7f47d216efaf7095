export { formatBytes } from "@/lib/format/bytes";
export const formatDate = (iso: string | null) => (iso ? new Date(iso).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" }) : "—");
export const formatTime = (iso: string) => new Date(iso).toLocaleString("en-GB");
