ALTER TABLE "catalog_cells" ADD COLUMN "min_voltage_v" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "rated_life_hours" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "rated_life_temperature_c" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "min_temperature_c" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "max_temperature_c" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "thermal_resistance_k_per_w" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "cold_capacitance_factor" double precision;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD COLUMN "cold_esr_factor" double precision;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "reliability_settings" jsonb DEFAULT '{"voltageDoublingStep":{"edlc":0.037,"hybrid":0.05,"electrolytic":0.2,"film":0.09},"maxLifeYears":20,"standbyDays":90,"yieldDistribution":"uniform"}'::jsonb NOT NULL;