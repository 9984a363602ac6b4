/** Colours of the product's theme (tailwind.config.ts) for e-mail: ink for text, copper for the accent. */
export const INK_900 = "#141a2b";
export const INK_600 = "#3a4b70";
export const INK_100 = "#e3e8f1";
export const COPPER = "#a95c2a";
export const PAPER = "#f3f5f9";
