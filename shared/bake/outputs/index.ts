export { writeJson, bakeToJson, type JsonCurve } from './json';
export { writePack, readPack, PACK_MAGIC, PACK_VERSION, HEADER_BYTES, DIRECTORY_ENTRY_BYTES, type PackCurve, type ReadCurve } from './bin';
export { writeCHeader, cIdent } from './c-header';
export { writeTsModule } from './ts-module';
export { writeGltfPack, gltfTrack } from './gltf';
export { writeCss, cssCurve, type CssCurve } from './css';
export { logicalEntries, type LogicalEntries } from './entries';
export { C_EVALUATOR } from './evaluator-c';
export { TS_EVALUATOR } from './evaluator-ts';
