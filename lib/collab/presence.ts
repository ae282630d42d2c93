/**
 * Presence on the Yjs awareness: who is in the room, their colour, their pointer and selection.
 * Pure functions only: the room page publishes the local state and draws the others from these.
 *
 * Awareness state of one person:
 *   { user: { name, colour }, pointer: [x, y] | null (section metres), selection: { parts: [...], zones: [...] } }
 */

export interface PresenceUser {
  name: string;
  colour: string;
}

export interface PresenceState {
  user: PresenceUser;
  pointer: readonly [number, number] | null;
  selection: { parts: readonly string[]; zones: readonly string[] };
}

export interface Peer extends PresenceState {
  clientId: number;
}

export const MAX_NAME_LENGTH = 40;
const MAX_SELECTED = 500;

/**
 * Our own set of twelve person colours: mid-saturation hues spaced around the wheel, dark enough for
 * white text and distinct from the temperature colours (which run blue to red through pale tones).
 */
export const PERSON_COLOURS: readonly string[] = Object.freeze([
  '#7b3fb5', '#1f7a4d', '#b5447a', '#2d5fa8', '#a8591d', '#5a7d12',
  '#8c2f39', '#16707f', '#6b4f2a', '#4a4fb0', '#9b3da8', '#3f7f6b',
]);

/** A colour for an awareness client id: the same id always gets the same colour. */
export function colourForClient(clientId: number): string {
  // Knuth's multiplicative hash spreads consecutive ids over the palette
  const h = Math.imul(clientId >>> 0, 2654435761) >>> 0;
  return PERSON_COLOURS[h % PERSON_COLOURS.length];
}

/** A name for someone who has not chosen one yet. */
export function defaultName(clientId: number): string {
  return `Guest ${String((clientId >>> 0) % 1000).padStart(3, '0')}`;
}

/** A typed name made safe to show: control characters removed, spaces collapsed, at most 40 characters; null if nothing is left. */
export function cleanName(raw: unknown): string | null {
  if (typeof raw !== 'string') return null;
  // eslint-disable-next-line no-control-regex
  const s = raw.replace(/[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u2028-\u202e]/g, '').replace(/\s+/g, ' ').trim();
  if (!s) return null;
  return Array.from(s).slice(0, MAX_NAME_LENGTH).join('');
}

const isColour = (v: unknown): v is string => typeof v === 'string' && /^#[0-9a-fA-F]{6}$/.test(v);
const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const ids = (v: unknown): string[] => (Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string' && x.length <= 100).slice(0, MAX_SELECTED) : []);

/**
 * Reads one awareness state sent by someone else, trusting nothing: a state without a usable user
 * is null; a bad pointer or selection is dropped.
 */
export function presenceOf(state: unknown, clientId: number): PresenceState | null {
  if (!state || typeof state !== 'object') return null;
  const s = state as Record<string, unknown>;
  const u = s.user as Record<string, unknown> | undefined;
  if (!u || typeof u !== 'object') return null;
  const name = cleanName(u.name) ?? defaultName(clientId);
  const colour = isColour(u.colour) ? u.colour : colourForClient(clientId);
  const p = s.pointer;
  const pointer = Array.isArray(p) && p.length === 2 && isFiniteNumber(p[0]) && isFiniteNumber(p[1]) ? ([p[0], p[1]] as const) : null;
  const sel = (s.selection ?? {}) as Record<string, unknown>;
  return { user: { name, colour }, pointer, selection: { parts: ids(sel.parts), zones: ids(sel.zones) } };
}

/** Everyone in the room except the local client, by name then id (a stable order for the list). */
export function peersOf(states: ReadonlyMap<number, unknown>, selfId: number): Peer[] {
  const out: Peer[] = [];
  for (const [clientId, state] of states) {
    if (clientId === selfId) continue;
    const p = presenceOf(state, clientId);
    if (p) out.push({ ...p, clientId });
  }
  return out.sort((a, b) => a.user.name.localeCompare(b.user.name) || a.clientId - b.clientId);
}

/** True when two pointers differ by more than `eps` metres (so a still pointer sends nothing). */
export function pointerMoved(a: readonly [number, number] | null, b: readonly [number, number] | null, eps = 1e-4): boolean {
  if (a === null || b === null) return a !== b;
  return Math.abs(a[0] - b[0]) > eps || Math.abs(a[1] - b[1]) > eps;
}
