-- Placeholder until this migration has statements.
SELECT 1;
