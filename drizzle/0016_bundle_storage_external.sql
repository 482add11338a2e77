-- Release bundles are zip files (already compressed): store them out of line and uncompressed, so a
-- download can read them in slices (substring) without PostgreSQL decompressing the whole value.
ALTER TABLE "releases" ALTER COLUMN "bundle" SET STORAGE EXTERNAL;
