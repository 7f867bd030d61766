/**
 * Classroom decks: an ordered list of slides, each showing a saved layout version of a machine
 * the author may see, or a sample layout made for teaching. Decks belong to the author's home
 * organisation (the dealer, for trainers and technicians) and are seen by its staff.
 * Read-only share links for decks use the same token scheme as layout links (sharing.ts).
 */
export * from './records';
export * from './schemas';
export * from './decks';
export * from './slides';
export * from './shares';
export * from './choices';
