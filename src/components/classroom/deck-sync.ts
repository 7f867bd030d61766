/**
 * Keeps the audience window and the presenter's window on the same slide. Both join one
 * BroadcastChannel per deck (same origin, same browser); each move is posted as the whole
 * stage state, and a window that opens asks the others for theirs.
 */
export interface StageState {
  index: number;
  cropPath: boolean;
  blank: boolean;
}

type Message = { type: 'state'; state: StageState; sender: string } | { type: 'hello'; sender: string };

export interface DeckSync {
  post: (state: StageState) => void;
  close: () => void;
}

export function joinDeck(deckId: string, onState: (s: StageState) => void, current: () => StageState): DeckSync {
  if (typeof BroadcastChannel === 'undefined') return { post: () => {}, close: () => {} };
  const me = Math.random().toString(36).slice(2);
  const channel = new BroadcastChannel(`cagewright-deck-${deckId}`);
  channel.onmessage = (e: MessageEvent<Message>) => {
    const m = e.data;
    if (!m || m.sender === me) return;
    if (m.type === 'hello') channel.postMessage({ type: 'state', state: current(), sender: me } satisfies Message);
    else if (m.type === 'state') onState(m.state);
  };
  channel.postMessage({ type: 'hello', sender: me } satisfies Message);
  return {
    post: (state) => channel.postMessage({ type: 'state', state, sender: me } satisfies Message),
    close: () => channel.close(),
  };
}
