/** The parts of the `datapackage` package (Frictionless Data, JavaScript) the export test uses; it ships no types. */
declare module 'datapackage' {
  export class Package {
    static load(descriptor: string | object, options?: { basePath?: string }): Promise<Package>;
    readonly valid: boolean;
    readonly errors: Error[];
    readonly resourceNames: string[];
    getResource(name: string): { tabular: boolean; read(options?: { keyed?: boolean; cast?: boolean }): Promise<unknown[]> } | null;
  }
}
