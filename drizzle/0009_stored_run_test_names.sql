-- Saved runs used the app's own test names; the app now uses the engine's. Rename them in every stored run's
-- parameters, result and method list so old runs keep opening and can be run again with the same request.
-- jsonb prints as "key": value, so the names are replaced as whole quoted values of "kind" and "null".
UPDATE "analysis_runs" SET
  "params" = replace(replace(replace(replace(replace(replace("params"::text,
    '"kind": "l-csr"', '"kind": "l-envelope"'),
    '"kind": "pcf"', '"kind": "pcf-envelope"'),
    '"kind": "k-diff"', '"kind": "k-difference"'),
    '"kind": "inhom-l"', '"kind": "inhomogeneous-l"'),
    '"null": "labelling"', '"null": "random-labelling"'),
    '"null": "fixed-a"', '"null": "a-fixed"')::jsonb,
  "result" = CASE WHEN "result" IS NULL THEN NULL ELSE replace(replace(replace(replace(replace(replace("result"::text,
    '"kind": "l-csr"', '"kind": "l-envelope"'),
    '"kind": "pcf"', '"kind": "pcf-envelope"'),
    '"kind": "k-diff"', '"kind": "k-difference"'),
    '"kind": "inhom-l"', '"kind": "inhomogeneous-l"'),
    '"null": "labelling"', '"null": "random-labelling"'),
    '"null": "fixed-a"', '"null": "a-fixed"')::jsonb END,
  "method" = regexp_replace(regexp_replace(regexp_replace(regexp_replace("method",
    '(^|,)l-csr(?=,|$)', '\1l-envelope', 'g'),
    '(^|,)pcf(?=,|$)', '\1pcf-envelope', 'g'),
    '(^|,)k-diff(?=,|$)', '\1k-difference', 'g'),
    '(^|,)inhom-l(?=,|$)', '\1inhomogeneous-l', 'g');
