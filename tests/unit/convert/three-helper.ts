// Loads a glTF asset with three.js 0.187.0 GLTFLoader in Node (ProgressEvent polyfill and
// createInterpolant usage as given in /work/shared/REFERENCES.md).
import { GLTFLoader } from 'three/examples/jsm/loaders/GLTFLoader.js';
import type { AnimationClip, KeyframeTrack } from 'three';

const g = globalThis as unknown as { ProgressEvent?: unknown };
g.ProgressEvent ??= class extends Event {
  constructor(t: string, i: object = {}) { super(t); Object.assign(this, i); }
};

export function loadWithThree(input: string | ArrayBuffer): Promise<AnimationClip> {
  return new Promise((resolve, reject) => {
    new GLTFLoader().parse(input, '', (gltf) => resolve(gltf.animations[0]), reject);
  });
}

/** Value of a scalar three.js track at time t (CUBICSPLINE value size is 3 per key: ÷3). */
export function threeSample(track: KeyframeTrack, t: number): number {
  const size = track.getValueSize();
  // GLTFLoader installs this named factory on CUBICSPLINE tracks (GLTFLoader.js _createCubicSplineTrackInterpolant).
  const tr = track as unknown as { createInterpolant: ((out: Float64Array) => { evaluate(t: number): ArrayLike<number> }) & { name?: string } };
  const custom = tr.createInterpolant.name === 'InterpolantFactoryMethodGLTFCubicSpline';
  const out = new Float64Array(custom ? size / 3 : size);
  return tr.createInterpolant(out).evaluate(t)[0];
}
