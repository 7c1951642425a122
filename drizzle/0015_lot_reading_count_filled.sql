-- Every lot stored before 0014 gets its readings' count (0014 added the column with 0 everywhere);
-- from here on the transaction that inserts or replaces a lot's readings keeps it.
UPDATE `lots` SET `reading_count` = (SELECT count(*) FROM `lot_readings` WHERE `lot_readings`.`lot_id` = `lots`.`id`);
