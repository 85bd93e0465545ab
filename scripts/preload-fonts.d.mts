// Types of preload-fonts.mjs, for the TypeScript that imports it (bench/lighthouse).

export const FIRST_PAGE_FONTS: readonly string[];
export function withFontPreloads(html: string, fontPaths: readonly string[]): string;
export function preloadFirstPageFonts(browserDir: string, faces?: readonly string[]): Promise<string[]>;
