-- A hybrid (lithium-ion) capacitor cell must carry its minimum voltage: the engine refuses any
-- arrangement that would take it below, and a cell without one cannot be sized safely.
-- Hybrid cells stored before this column existed get the usual 2.2 V (common practice); the shop
-- should replace it with its supplier's figure.
UPDATE "catalog_cells" SET "min_voltage_v" = 2.2 WHERE "technology" = 'hybrid' AND "min_voltage_v" IS NULL;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD CONSTRAINT "catalog_cells_hybrid_min_voltage_ck" CHECK ("technology" <> 'hybrid' OR ("min_voltage_v" IS NOT NULL AND "min_voltage_v" > 0 AND "min_voltage_v" < "rated_voltage_v"));
