/**
 * The one error shape every Loamline API route answers with (docs/architecture.md).
 * `fields` names the input fields that were wrong, with a message each.
 */
export interface ApiError {
  statusCode: number;
  error: string;
  message: string;
  fields?: Record<string, string>;
}
