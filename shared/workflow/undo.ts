/** How long a studio can take back the last stage move of a firing (and its effects on requests). */
export const UNDO_WINDOW_MS = 10 * 60_000
