-- The register's search box matches any part of an asset's code or name (ILIKE '%text%'), which
-- a b-tree cannot serve; trigram GIN indexes on asset_summaries (next migration) can. pg_trgm
-- ships with PostgreSQL (contrib) and is a trusted extension: a database owner may create it.
CREATE EXTENSION IF NOT EXISTS pg_trgm;
