-- readings_as_entered() as first written ran a query per call: 13 µs a row, 13 s for a million-row import. Now
-- readings without positions (every type but eccentricity) are one expression the planner inlines (about 1 µs); only
-- eccentricity's five positions take the zipping path. STABLE, not IMMUTABLE: turning numbers into text goes through
-- output functions, and PostgreSQL inlines a function only when its declared volatility is honest.
CREATE OR REPLACE FUNCTION readings_with_positions(vals numeric[], positions text[]) RETURNS text
LANGUAGE sql STABLE PARALLEL SAFE AS $$
  SELECT string_agg(coalesce(p || '=', '') || v::text, ' ' ORDER BY o) FROM unnest(vals, positions) WITH ORDINALITY AS x(v, p, o)
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION readings_as_entered(vals numeric[], positions text[]) RETURNS text
LANGUAGE sql STABLE PARALLEL SAFE AS $$
  SELECT CASE WHEN coalesce(cardinality(array_remove(positions, NULL)), 0) = 0 THEN array_to_string(vals::text[], ' ') ELSE readings_with_positions(vals, positions) END
$$;
