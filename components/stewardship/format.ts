export { formatBytes } from "@/lib/format/bytes";
export { formatDay as formatDate, formatWhen as formatTime } from "@/lib/format/dates";
