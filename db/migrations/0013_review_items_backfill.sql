-- The analyses of reviews made before review_items existed. Only a review still waiting for its
-- decision holds its analyses open; where earlier simultaneous submissions put one analysis in
-- several waiting reviews, the oldest keeps it open and the others list it closed.
INSERT INTO "review_items" ("review_id", "analysis_id", "open")
SELECT r."id", a."value", false
FROM "reviews" r
CROSS JOIN LATERAL jsonb_array_elements_text(r."analysis_ids") AS a("value")
JOIN "analyses" an ON an."id" = a."value"
ON CONFLICT DO NOTHING;
--> statement-breakpoint
UPDATE "review_items" i SET "open" = true
FROM "reviews" r
WHERE r."id" = i."review_id" AND r."status" = 'submitted'
  AND r."submitted_at" = (
    SELECT min(r2."submitted_at") FROM "reviews" r2
    JOIN "review_items" i2 ON i2."review_id" = r2."id"
    WHERE i2."analysis_id" = i."analysis_id" AND r2."status" = 'submitted'
  );
