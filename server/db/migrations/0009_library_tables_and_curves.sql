ALTER TABLE `materials` ADD `property_table` json;--> statement-breakpoint
ALTER TABLE `materials` ADD `property_table_source` text;--> statement-breakpoint
ALTER TABLE `quenchants` ADD `cooling_curves` json;--> statement-breakpoint
ALTER TABLE `quenchants` ADD `emissivity` double;--> statement-breakpoint
ALTER TABLE `quenchants` ADD `curve_source` text;