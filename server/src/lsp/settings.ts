// Server settings under the `thermoscribe` namespace: from initializationOptions at start, then
// from workspace/configuration (pulled at start and on every didChangeConfiguration).

export interface Settings {
  /** Delay between the last change and re-checking, ms, for a document whose last check took at least as long (a faster one is checked at once: lsp/diagnostics.ts). */
  debounceMs: number;
  inlayHintsEnabled: boolean;
}

export const DEFAULT_SETTINGS: Settings = { debounceMs: 200, inlayHintsEnabled: true };

/**
 * Merges a settings object as a client sends it ({debounceMs, inlayHints: {enabled}} or the dotted
 * form {'inlayHints.enabled'}) over the current settings; wrong types and absurd values are ignored.
 */
export function mergeSettings(current: Settings, raw: unknown): Settings {
  if (!raw || typeof raw !== 'object') return current;
  const r = raw as Record<string, unknown>;
  const next = { ...current };
  const debounce = r['debounceMs'];
  if (typeof debounce === 'number' && Number.isFinite(debounce) && debounce >= 0 && debounce <= 60_000) next.debounceMs = debounce;
  const hints = r['inlayHints'];
  const enabled = hints && typeof hints === 'object' ? (hints as Record<string, unknown>)['enabled'] : r['inlayHints.enabled'];
  if (typeof enabled === 'boolean') next.inlayHintsEnabled = enabled;
  return next;
}
