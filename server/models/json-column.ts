import { DataTypes } from 'sequelize';

/** A TEXT column holding JSON, parsed on read. SQLite has no JSON type of its own in Sequelize. */
export function jsonColumn<T>(field: string, fallback: T) {
  return {
    type: DataTypes.TEXT,
    allowNull: false,
    get(this: { getDataValue(key: string): unknown }): T {
      const raw = this.getDataValue(field);
      if (typeof raw !== 'string') return fallback;
      try {
        return JSON.parse(raw) as T;
      } catch {
        return fallback;
      }
    },
    set(this: { setDataValue(key: string, value: unknown): void }, value: T) {
      this.setDataValue(field, JSON.stringify(value));
    },
  };
}
