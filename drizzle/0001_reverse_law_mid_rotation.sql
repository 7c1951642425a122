-- The reverse audio law's parameter m is now y(0.5), its mid-rotation value, as for every other
-- law (shared/taper/law.ts). Saved harness designs stored the mirrored audio law's m, whose
-- y(0.5) is 1 − m; each such value becomes 1 − m, which leaves the curve unchanged.
UPDATE `harnesses` SET `values` = json_set(`values`, '$.volumeLaw.m', 1 - json_extract(`values`, '$.volumeLaw.m'))
WHERE json_extract(`values`, '$.volumeLaw.kind') = 'reverse' AND json_type(`values`, '$.volumeLaw.m') IN ('real', 'integer');
--> statement-breakpoint
UPDATE `harnesses` SET `values` = json_set(`values`, '$.toneLaw.m', 1 - json_extract(`values`, '$.toneLaw.m'))
WHERE json_extract(`values`, '$.toneLaw.kind') = 'reverse' AND json_type(`values`, '$.toneLaw.m') IN ('real', 'integer');
