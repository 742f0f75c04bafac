ALTER TABLE `trajectories` ADD `equilibration_frame` int;--> statement-breakpoint
ALTER TABLE `trajectories` ADD `equilibration_series` varchar(80);