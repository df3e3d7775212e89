/** Header (or `?token=` query parameter) carrying the development token that opens the Dev outbox. */
export const DEV_OUTBOX_TOKEN_HEADER = 'X-Dev-Outbox-Token';
