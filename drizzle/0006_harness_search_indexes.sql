DROP INDEX `harness_components_shop_key_idx` ON `harness_components`;--> statement-breakpoint
DROP INDEX `harness_components_shop_label_idx` ON `harness_components`;--> statement-breakpoint
DROP INDEX `harness_pins_shop_function_idx` ON `harness_pins`;--> statement-breakpoint
DROP INDEX `harness_wires_shop_circuit_idx` ON `harness_wires`;--> statement-breakpoint
DROP INDEX `harness_wires_shop_color_idx` ON `harness_wires`;--> statement-breakpoint
DROP INDEX `harness_wires_shop_key_idx` ON `harness_wires`;--> statement-breakpoint
CREATE INDEX `harness_wires_revision_circuit_idx` ON `harness_wires` (`revision_id`,`circuit`);--> statement-breakpoint
CREATE INDEX `harness_wires_revision_color_idx` ON `harness_wires` (`revision_id`,`color`);