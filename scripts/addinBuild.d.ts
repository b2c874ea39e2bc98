export declare const OFFICE_JS_CDN: string;
export declare const DEV_BASE: string;
export declare function parseBase(base: string): string;
export declare function manifestForBase(template: string, base: string): string;
export declare function contentSecurityPolicy(page: { officeHost: boolean }): string;
