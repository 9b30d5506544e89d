/** Types for retry.js (plain browser JavaScript served as is). */
export declare const retryBaseMs: number;
export declare const retryCapMs: number;
export declare function retryDelay(attempt: number, random: number): number;
export declare function isRetryableStatus(status: number): boolean;
