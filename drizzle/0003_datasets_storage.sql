-- Stored files and columns: lz4 instead of the default pglz for the original CSV chunks (CSV text
-- compresses well, and lz4 is several times faster to write), and no compression attempt at all for
-- the binary column values (Float64/Int32 bytes barely compress; trying costs ingest time).
ALTER TABLE dataset_file_chunks ALTER COLUMN data SET COMPRESSION lz4;
--> statement-breakpoint
ALTER TABLE dataset_columns ALTER COLUMN data SET STORAGE EXTERNAL;
