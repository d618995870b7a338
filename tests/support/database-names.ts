export const templateDatabase = 'rimelog_template';

/** The same server URL with another database name. */
export function withDatabaseName(url: string, name: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${name}`;
  return parsed.toString();
}
