// Minimal typing of the gltf-validator 2.0.0-dev.3.10 API used by the conversion tests (its README).
declare module 'gltf-validator' {
  interface ValidationReport {
    issues: { numErrors: number; numWarnings: number; numInfos: number; messages: { code: string; message: string; pointer?: string }[] };
  }
  const validator: {
    validateBytes(data: Uint8Array, options?: { format?: 'gltf' | 'glb'; writeTimestamp?: boolean; externalResourceFunction?: (uri: string) => Promise<Uint8Array> }): Promise<ValidationReport>;
  };
  export default validator;
}
