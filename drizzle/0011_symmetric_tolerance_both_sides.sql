-- Tolerances are stored per side: tolerance_pct below nominal, tolerance_plus_pct above it (a Z part
-- or lot is −20 %/+80 %). Every tolerance stored before was symmetric, so its upper side equals
-- its lower side; the stored lot statistics were computed against those same limits and stay valid.
UPDATE `parts` SET `tolerance_plus_pct` = `tolerance_pct` WHERE `tolerance_pct` IS NOT NULL AND `tolerance_plus_pct` IS NULL;
--> statement-breakpoint
UPDATE `lots` SET `tolerance_plus_pct` = `tolerance_pct` WHERE `tolerance_plus_pct` IS NULL;
--> statement-breakpoint
UPDATE `lot_stats` SET `tolerance_plus_pct` = `tolerance_pct` WHERE `tolerance_plus_pct` IS NULL;
