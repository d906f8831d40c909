// How much one upload may carry. The server refuses more; the upload page checks the
// same limits in the browser before sending a byte. Pure, so both sides import it.

/** The largest take file the server accepts: 2 MiB (2,097,152 bytes). */
export const MAX_TAKE_BYTES = 2 * 1024 * 1024;
/** The most files one post may carry (the upload page's no-JavaScript form sends several). */
export const MAX_FILES = 10;
