-- The demo site (WHD26) stored each find's z as a negative depth below the ground. Every z in Loamwork is now a
-- reduced level against the site's datum: give the demo's trenches their ground-surface levels and its finds
-- their reduced levels. Other sites are left alone.
UPDATE "sites" SET "datum_name" = 'Whinnydale site datum (TBM WH1 taken as 50.000 m)' WHERE "code" = 'WHD26' AND "datum_name" = 'Site datum';--> statement-breakpoint
UPDATE "trenches" t SET "surface_level" = v.surface
  FROM (VALUES ('A', 49.62::double precision), ('B', 49.35::double precision), ('C', 49.81::double precision)) AS v(code, surface), "sites" s
  WHERE s.id = t.site_id AND s.code = 'WHD26' AND t.code = v.code AND t.surface_level IS NULL;--> statement-breakpoint
UPDATE "finds" f SET "z" = round((t.surface_level + f.z)::numeric, 3)::double precision
  FROM "trenches" t, "sites" s
  WHERE f.trench_id = t.id AND s.id = f.site_id AND s.code = 'WHD26' AND f.z < 0 AND t.surface_level IS NOT NULL;
