-- The drop-analysis engine's warning codes are snake_case now (left_right_disagree, low_contrast,
-- drop_cut_by_border, needle_in_contact, too_few_edge_points, baseline_not_found,
-- fit_did_not_converge, …), like every other code the product returns. Stored analyses keep the
-- engine's output in analyses.result; their warning codes are rewritten here so old and new
-- revisions read alike. Only the codes change: angles, digests of approved reviews (which cover
-- revision ids and angles only) and messages stay as they were.
UPDATE analyses
SET result = jsonb_set(
  result,
  '{warnings}',
  (
    SELECT jsonb_agg(
      CASE
        WHEN jsonb_typeof(w) = 'object' AND w ? 'code'
          THEN jsonb_set(w, '{code}', to_jsonb(replace(w ->> 'code', '-', '_')))
        ELSE w
      END
      ORDER BY ordinality
    )
    FROM jsonb_array_elements(result -> 'warnings') WITH ORDINALITY AS t (w, ordinality)
  )
)
WHERE jsonb_typeof(result -> 'warnings') = 'array'
  AND jsonb_array_length(result -> 'warnings') > 0
  AND EXISTS (
    SELECT 1 FROM jsonb_array_elements(result -> 'warnings') AS e (w)
    WHERE w ->> 'code' LIKE '%-%'
  );
