-- The unit's on-load tap changer (issue 16): optional register column oltc,
-- "none", "sealed" or "communicating" (its compartment can exchange oil with
-- the main tank). Null: not given.
ALTER TABLE units ADD COLUMN oltc TEXT;
