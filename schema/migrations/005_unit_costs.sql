-- The unit's own costs for the budgeted plan (issue 22): optional register
-- columns replacement_cost and refurbishment_cost, in the site's currency
-- ([costs] currency, a label). Null: the configured costs apply.
ALTER TABLE units ADD COLUMN replacement_cost REAL;
ALTER TABLE units ADD COLUMN refurbishment_cost REAL;
