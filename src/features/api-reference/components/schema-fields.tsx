import type { SchemaObject } from '../api/get-openapi';

/** A schema in a few words: "string, uuid", "integer 1–200", "one of: sent, pending". */
export function describeSchema(s: SchemaObject): string {
  if (s.$ref) return s.$ref.split('/').pop()!;
  const variants = s.anyOf ?? s.oneOf;
  if (variants) return variants.map(describeSchema).join(' or ');
  if (s.allOf) return s.allOf.map(describeSchema).join(' and ');
  if (s.const !== undefined) return JSON.stringify(s.const);
  if (s.enum) return `one of: ${s.enum.map((v) => JSON.stringify(v)).join(', ')}`;
  const parts = [Array.isArray(s.type) ? s.type.join(' or ') : (s.type ?? 'any')];
  if (s.format) parts.push(s.format);
  const range = (lo?: number, hi?: number, unit = '') =>
    lo !== undefined && hi !== undefined
      ? `${lo}–${hi}${unit}`
      : lo !== undefined
        ? `at least ${lo}${unit}`
        : hi !== undefined
          ? `at most ${hi}${unit}`
          : '';
  parts.push(range(s.minLength, s.maxLength, ' characters'), range(s.minimum, s.maximum));
  parts.push(range(s.minItems, s.maxItems, ' items'));
  if (s.type === 'array' && s.items && !s.items.properties) parts.push(`of ${describeSchema(s.items)}`);
  if (s.default !== undefined) parts.push(`default ${JSON.stringify(s.default)}`);
  return parts.filter(Boolean).join(', ');
}

/** An object schema's fields as a list, nested objects indented below their field. */
export function SchemaFields({ schema, depth = 0 }: { schema: SchemaObject; depth?: number }) {
  const object = schema.type === 'array' && schema.items ? schema.items : schema;
  if (!object.properties) return <p className="text-sm">{describeSchema(schema)}</p>;
  return (
    <ul className={`flex flex-col gap-1 text-sm ${depth ? 'ml-5 border-l border-rule pl-3' : ''}`}>
      {Object.entries(object.properties).map(([name, field]) => (
        <li key={name}>
          <code className="font-semibold">{name}</code>
          {object.required?.includes(name) ? '' : ' (optional)'} — {describeSchema(field)}
          {depth < 3 && (field.properties || field.items?.properties) && (
            <SchemaFields schema={field} depth={depth + 1} />
          )}
        </li>
      ))}
    </ul>
  );
}
