/** How a one-time message after a form reads: done, for information, or gone wrong. */
export type FlashTone = "success" | "info" | "error";
