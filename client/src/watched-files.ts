// Glob patterns of the files the server reads from the disk without the editor syncing them (see
// disk-watch.ts): apart from the editor API so that a test can read them. A bench log of another
// extension is read again on the spec's next edit.
export const WATCHED = ['**/*_conversion.c', '**/*.{csv,CSV}', '**/*.tsense'] as const;
