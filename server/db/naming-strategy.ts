import { DefaultNamingStrategy, type NamingStrategyInterface } from 'typeorm';

const snake = (s: string): string => s.replace(/([a-z0-9])([A-Z])/g, '$1_$2').toLowerCase();

/** camelCase properties map to snake_case columns, so entities need no per-column `name`. */
export class SnakeNamingStrategy extends DefaultNamingStrategy implements NamingStrategyInterface {
  override columnName(propertyName: string, customName: string | undefined, embeddedPrefixes: string[]): string {
    return snake([...embeddedPrefixes, customName ?? propertyName].join('_'));
  }
  override joinColumnName(relationName: string, referencedColumnName: string): string {
    return snake(`${relationName}_${referencedColumnName}`);
  }
}
