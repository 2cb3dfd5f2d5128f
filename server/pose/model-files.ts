import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { io } from '@tensorflow/tfjs-core';
import type { ModelSource } from '@shared/pose/pose-detector';

/** models/ at the repository root (the CLI and tests run from there, or set STANCELINE_MODELS_DIR). */
export function defaultModelsDir(): string {
  return resolve(process.env.STANCELINE_MODELS_DIR ?? join(process.cwd(), 'models'));
}

interface ModelJson {
  modelTopology: object;
  format?: string;
  generatedBy?: string;
  convertedBy?: string;
  signature?: object;
  userDefinedMetadata?: Record<string, object>;
  weightsManifest: { paths: string[]; weights: io.WeightsManifestEntry[] }[];
}

/** An IOHandler that reads a TF.js graph model (model.json + weight shards) from a folder. */
export function fileModelHandler(folder: string): io.IOHandler {
  return {
    async load(): Promise<io.ModelArtifacts> {
      const jsonPath = join(folder, 'model.json');
      let json: ModelJson;
      try {
        json = JSON.parse(readFileSync(jsonPath, 'utf8')) as ModelJson;
      } catch (error) {
        throw new Error(`cannot read pose model ${jsonPath}: ${(error as Error).message}`);
      }
      const shards = json.weightsManifest.flatMap((group) =>
        group.paths.map((p) => readFileSync(join(folder, p))),
      );
      const weights = Buffer.concat(shards);
      return {
        modelTopology: json.modelTopology,
        format: json.format,
        generatedBy: json.generatedBy,
        convertedBy: json.convertedBy,
        signature: json.signature,
        userDefinedMetadata: json.userDefinedMetadata,
        weightSpecs: json.weightsManifest.flatMap((group) => group.weights),
        weightData: weights.buffer.slice(weights.byteOffset, weights.byteOffset + weights.byteLength),
      };
    },
  };
}

export function fileModelSource(modelsDir = defaultModelsDir()): ModelSource {
  return (dir) => fileModelHandler(join(modelsDir, dir));
}
