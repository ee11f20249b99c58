/**
 * What later schema versions changed, undone on a store made by this whereabouts, so that a test holds a store
 * of an older version (src/store/gazetteer-store.ts, MIGRATIONS) and checks that it is migrated when opened.
 */

/**
 * Version 5 undone: the unit names without the column naming each unit's own feature, each row once.
 * @example raw.exec(`${VERSION_5_UNDONE} PRAGMA user_version = 4;`)
 */
export const VERSION_5_UNDONE = `CREATE TABLE unit_names_v4 (key TEXT NOT NULL, level INTEGER NOT NULL, unit_key TEXT NOT NULL, source INTEGER NOT NULL,
    PRIMARY KEY (key, level, unit_key, source)) WITHOUT ROWID;
  INSERT OR IGNORE INTO unit_names_v4 SELECT key, level, unit_key, source FROM unit_names;
  DROP TABLE unit_names;
  ALTER TABLE unit_names_v4 RENAME TO unit_names;`;

/** Version 4 undone: the country outlines unindexed. */
export const VERSION_4_UNDONE = 'DROP INDEX features_country_polygons;';
