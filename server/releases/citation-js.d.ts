declare module '@citation-js/core' {
  export class Cite {
    constructor(data: unknown);
    format(format: string, options?: Record<string, unknown>): string | unknown;
    static async(data: unknown): Promise<Cite>;
    data: Array<Record<string, unknown>>;
  }
  export const plugins: Record<string, unknown>;
}
declare module '@citation-js/plugin-bibtex';
declare module '@citation-js/plugin-ris';
declare module '@citation-js/plugin-csl';
