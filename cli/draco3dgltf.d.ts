/** The part of the `draco3dgltf` package the CLI uses (the package ships no types). */
declare module 'draco3dgltf' {
  /** Emscripten module options; `wasmBinary` skips locating the .wasm file on disk. */
  interface DracoModuleOptions {
    wasmBinary?: Uint8Array | ArrayBuffer;
  }
  /** Creates the decoder module that @gltf-transform's KHR_draco_mesh_compression reads with. */
  export function createDecoderModule(options?: DracoModuleOptions): Promise<unknown>;
  /** Creates the encoder module. */
  export function createEncoderModule(options?: DracoModuleOptions): Promise<unknown>;
  const draco: {
    createDecoderModule: typeof createDecoderModule;
    createEncoderModule: typeof createEncoderModule;
  };
  export default draco;
}
