import { readDem, type Dem } from '../../../src/terrain/dem.js';
import { readGrib2 } from '../../../src/forecast/grib2.js';
import { validTimes } from '../../../src/forecast/profile.js';
import { valueAt } from './document.js';

/**
 * The binary files a scenario may name: a GRIB2 forecast (`weather.forecast.file`) and a GeoTIFF
 * elevation model (`site.terrain`). The page keeps their bytes beside the scenario's JSON, by file
 * name (a browser knows no folders), and decodes a GeoTIFF once when it is opened: geotiff reads
 * asynchronously, while validating a scenario is synchronous. The decoding itself is the command
 * line's own (src/forecast/grib2.ts, src/terrain/dem.ts).
 *
 * @example
 *   const binaries = await readBinaryFiles(files);      // from an <input type=file> or a drop
 *   parseScenario(json, { readBytes: binaryReader(binaries), dems: demsFor(json, binaries) });
 */

export interface BinaryFiles {
  /** File bytes by file name. */
  readonly bytes: Readonly<Record<string, Uint8Array>>;
  /** Elevation models decoded from the GeoTIFF files among them (or why one could not be read). */
  readonly dems: Readonly<Record<string, Dem | Error>>;
}

export const NO_BINARIES: BinaryFiles = { bytes: {}, dems: {} };

const FORECAST_NAME = /\.(grib2?|grb2?)$/i;
const TERRAIN_NAME = /\.tiff?$/i;

export function isForecastFile(name: string): boolean {
  return FORECAST_NAME.test(name);
}

export function isTerrainFile(name: string): boolean {
  return TERRAIN_NAME.test(name);
}

/** Files the page reads as bytes rather than text. */
export function isBinaryFile(name: string): boolean {
  return isForecastFile(name) || isTerrainFile(name);
}

function baseName(path: string): string {
  return path.split(/[/\\]/).pop() ?? path;
}

/** Reads the forecast and terrain files among `files`, added to (and replacing by name in) `previous`. */
export async function readBinaryFiles(files: readonly File[], previous: BinaryFiles = NO_BINARIES): Promise<BinaryFiles> {
  const bytes: Record<string, Uint8Array> = { ...previous.bytes };
  const dems: Record<string, Dem | Error> = { ...previous.dems };
  for (const file of files) {
    if (!isBinaryFile(file.name)) continue;
    const data = new Uint8Array(await file.arrayBuffer());
    bytes[file.name] = data;
    delete dems[file.name];
    if (isTerrainFile(file.name)) {
      try {
        dems[file.name] = await readDem(data);
      } catch (error) {
        dems[file.name] = error instanceof Error ? error : new Error(String(error));
      }
    }
  }
  return { bytes, dems };
}

function notOpened(name: string): Error {
  return new Error(`'${name}' is not loaded in the page; load it in the Site tab, or open it together with the scenario`);
}

/** `readBytes` for parseScenario: a file by the name the scenario writes (its folder ignored). */
export function binaryReader(binaries: BinaryFiles | undefined): (path: string) => Uint8Array {
  return (path) => {
    const data = binaries?.bytes[baseName(path)];
    if (data === undefined) throw notOpened(baseName(path));
    return data;
  };
}

/** `dems` for parseScenario: the model `site.terrain` names, under the key it is written with. */
export function demsFor(json: unknown, binaries: BinaryFiles | undefined): Map<string, Dem | Error> {
  const dems = new Map<string, Dem | Error>();
  const spec = valueAt(json, ['site', 'terrain']);
  if (typeof spec === 'string') dems.set(spec, binaries?.dems[baseName(spec)] ?? notOpened(baseName(spec)));
  return dems;
}

/** The valid times a loaded forecast file holds (ms UTC, sorted), or the reason it cannot be read. */
export function forecastTimes(bytes: Uint8Array): { times: number[] } | { error: string } {
  try {
    return { times: [...validTimes(readGrib2(bytes))].sort((a, b) => a - b) };
  } catch (error) {
    return { error: error instanceof Error ? error.message : String(error) };
  }
}
