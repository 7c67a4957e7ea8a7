import { readFileSync } from "node:fs";
import { join } from "node:path";
import { Ajv2020, type ErrorObject, type ValidateFunction } from "ajv/dist/2020.js";
import { packageRoot } from "../util/packageRoot.js";
import { schemaInputError } from "./schemaErrors.js";

/** The parts of schema/study.schema.json a document can be checked against. */
export type SchemaPart = "study" | "stack";

let validators: Record<SchemaPart, ValidateFunction> | null = null;

/** Compiles the shipped schema once (Ajv, JSON Schema draft 2020-12, all errors, strict mode; `required` inside an `if` names fields of the `then`). */
function validatorsOnce(): Record<SchemaPart, ValidateFunction> {
  if (validators === null) {
    const schema = JSON.parse(readFileSync(join(packageRoot(), "schema", "study.schema.json"), "utf8")) as { $id: string };
    const ajv = new Ajv2020({ allErrors: true, verbose: true, strict: true, strictRequired: false });
    ajv.addSchema(schema);
    validators = {
      study: ajv.getSchema(schema.$id)!,
      stack: ajv.getSchema(`${schema.$id}#/$defs/stack`)!,
    };
  }
  return validators;
}

/**
 * Checks `doc` against the study schema (or its stack part); per-field types, ranges, enums and
 * unknown fields live there alone. Throws the InputError of the most telling problem, with field
 * paths under `prefix`. `ignore(path)` drops errors below a path checked elsewhere.
 */
export function checkStudySchema(part: SchemaPart, doc: unknown, prefix = "", ignore?: (pointer: string) => boolean): void {
  const validate = validatorsOnce()[part];
  if (validate(doc)) return;
  const errors: ErrorObject[] = (validate.errors ?? []).filter((e) => ignore === undefined || !ignore(e.instancePath));
  if (errors.length > 0) throw schemaInputError(errors, doc, prefix);
}

/** The whole study document except its stack (checked per sweep combination by validateStack). */
export function checkStudyDocument(doc: unknown): void {
  checkStudySchema("study", doc, "", (pointer) => pointer === "/stack" || pointer.startsWith("/stack/"));
}
