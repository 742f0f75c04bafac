ALTER TABLE `trajectories` ADD `periodic_axes` varchar(3);--> statement-breakpoint
ALTER TABLE `trajectories` ADD `constraints` int;--> statement-breakpoint
ALTER TABLE `trajectories` ADD `species_elements` json;