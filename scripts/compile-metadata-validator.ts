// Writes the ahead-of-time compiled metadata validator (see shared/metadata/compile-metadata-validator.ts).
import fs from 'node:fs';
import { GENERATED_VALIDATOR, metadataValidatorSource } from '../shared/metadata/compile-metadata-validator';

fs.writeFileSync(GENERATED_VALIDATOR, metadataValidatorSource());
console.log(`wrote ${GENERATED_VALIDATOR}`);
