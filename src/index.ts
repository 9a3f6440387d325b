/**
 * linkwright: Markdown design notes in, linkage design-calculation packages out.
 * The public library API re-exports its layers.
 */
export * from './linkage/index.js'
