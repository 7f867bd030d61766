/**
 * The cage editor island. Astro renders it with `client:load` from the layout page, passing the
 * page's data as props; the island makes its own store from them (one per island).
 */
import { EditorStoreProvider } from './store/context';
import type { EditorInit } from './store/types';
import { EditorApp } from './EditorApp';

export default function EditorIsland(props: { init: EditorInit }) {
  return (
    <EditorStoreProvider init={props.init}>
      <EditorApp />
    </EditorStoreProvider>
  );
}
