// Model files: the learned energy model as versioned JSON on disk (docs/model-format.md).
export { MODEL_FORMAT, MODEL_VERSION, ModelFileError, parseModel, readModelFile, serializeModel, validateModel, writeModelFile } from './modelFile.ts';
