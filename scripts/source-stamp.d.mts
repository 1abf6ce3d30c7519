export declare const CLI_SOURCES: string[];
export declare const APP_SOURCES: string[];
export declare function sourceStamp(root: string, items: string[]): string;
export declare function cliBundleIsStale(root: string): boolean;
