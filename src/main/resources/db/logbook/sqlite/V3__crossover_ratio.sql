-- Logbook schema 3 (SQLite): the ratio the crossover verdict reads, taken from the stored measurement where it has it.
ALTER TABLE measurements ADD COLUMN crossover_ratio REAL;
UPDATE measurements SET crossover_ratio = json_extract(measurement_json, '$.crossover.verdict_ratio') WHERE json_valid(measurement_json);
PRAGMA user_version = 3;
