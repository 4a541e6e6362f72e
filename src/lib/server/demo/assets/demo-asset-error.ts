/**
 * An expected failure while generating a demo asset: a build plan names an animation, node or
 * key the generated document does not have. The code is stable; the message says what to change.
 */
export class DemoAssetError extends Error {
  constructor(
    readonly code: 'demo.target-missing' | 'demo.key-out-of-range' | 'demo.unsupported-channel',
    message: string,
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'DemoAssetError';
  }
}
