/** `npm run openapi`: writes ../openapi.yaml from the route specs (the file is committed; a test checks it is current). */
import { writeFileSync } from 'node:fs';
import { openApiYaml, OPENAPI_PATH } from './yaml.js';

writeFileSync(OPENAPI_PATH, openApiYaml());
console.log(`wrote ${OPENAPI_PATH}`);
