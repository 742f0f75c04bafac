ALTER TABLE `projects` ADD `interaction_model` json;--> statement-breakpoint
ALTER TABLE `trajectories` ADD `interaction_model` json;--> statement-breakpoint
ALTER TABLE `trajectories` ADD `file_quantities` json;--> statement-breakpoint
ALTER TABLE `trajectories` ADD `file_values` json;