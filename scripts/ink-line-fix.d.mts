/** types of scripts/ink-line-fix.mjs (a plain .mjs for the build script) */
export declare const INK_LINE_FAULT: string;
export declare const INK_LINE_FIXED: string;
export declare function fixInkLogUpdate(source: string): string;
export declare const inkLineFix: { name: string; setup(b: unknown): void };
