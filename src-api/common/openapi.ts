import { applyDecorators } from '@nestjs/common';
import { ApiBody as SwaggerBody, ApiOkResponse, ApiQuery as SwaggerQuery, ApiResponse } from '@nestjs/swagger';
import { z } from 'zod';
import { errorEnvelopeSchema } from '../../shared/schemas/common';

type JsonSchema = Record<string, unknown>;

/** JSON Schema for OpenAPI from the same zod schema that validates the request. */
export function jsonSchemaOf(schema: z.ZodType, io: 'input' | 'output' = 'input'): JsonSchema {
  const js = z.toJSONSchema(schema, { io, unrepresentable: 'any', target: 'openapi-3.0' }) as JsonSchema;
  delete js.$schema;
  return js;
}

const errorSchema = jsonSchemaOf(errorEnvelopeSchema, 'output');

export const ApiBody = (schema: z.ZodType) => SwaggerBody({ schema: jsonSchemaOf(schema) });

export const ApiResult = (schema: z.ZodType, status = 200) =>
  applyDecorators(
    status === 200 ? ApiOkResponse({ schema: jsonSchemaOf(schema, 'output') }) : ApiResponse({ status, schema: jsonSchemaOf(schema, 'output') }),
    ApiResponse({ status: 400, description: 'Bad input', schema: errorSchema }),
    ApiResponse({ status: 401, description: 'Not signed in', schema: errorSchema }),
    ApiResponse({ status: 403, description: 'Role may not do this, or CSRF token missing', schema: errorSchema }),
  );

/** One ApiQuery per key of an object schema. */
export function ApiQueryOf(schema: z.ZodObject) {
  const js = jsonSchemaOf(schema) as { properties?: Record<string, JsonSchema>; required?: string[] };
  return applyDecorators(
    ...Object.entries(js.properties ?? {}).map(([name, s]) =>
      SwaggerQuery({ name, required: (js.required ?? []).includes(name) && !('default' in s), schema: s }),
    ),
  );
}
