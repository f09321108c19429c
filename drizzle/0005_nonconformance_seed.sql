-- Signed records are never changed: a signature and the dispositions it covers are append-only.
CREATE OR REPLACE FUNCTION yokeline_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '% rows are append-only: signed records cannot be changed or removed', TG_TABLE_NAME USING ERRCODE = 'insufficient_privilege';
END $$;
--> statement-breakpoint
CREATE TRIGGER e_signature_append_only BEFORE UPDATE OR DELETE ON "e_signature" FOR EACH ROW EXECUTE FUNCTION yokeline_refuse_change();
--> statement-breakpoint
CREATE TRIGGER disposition_append_only BEFORE UPDATE OR DELETE ON "disposition" FOR EACH ROW EXECUTE FUNCTION yokeline_refuse_change();
--> statement-breakpoint
-- A starter list of defect codes for laminated stator cores; engineers edit it in the app.
INSERT INTO "defect_code" ("code", "name", "description") VALUES
  ('BURR', 'Burr height over limit', 'Punching burr above the drawing limit; usually die wear'),
  ('BORE', 'Bore diameter out of tolerance', NULL),
  ('OD', 'Outside diameter out of tolerance', NULL),
  ('ROUND', 'Roundness or ovality', 'Bore or OD out of round'),
  ('COAX', 'Bore-to-OD eccentricity', 'Bore and outside diameter not concentric'),
  ('STACK', 'Stack length or parallelism', 'Stack height, end-face parallelism or squareness'),
  ('SF', 'Stacking factor low', 'Core built light: too little steel for its length'),
  ('INSUL', 'Interlaminar insulation low', 'Surface insulation resistance below limit, shorted laminations'),
  ('LOSS', 'Core loss or hot spot', 'Ring test loss high or a local hot spot'),
  ('WELD', 'Weld, interlock or bond defect', 'Seam, interlock tab, rivet, cleat or bond not holding the stack'),
  ('SLOT', 'Slot geometry', 'Slot width, skew or misaligned laminations in the slot'),
  ('RUST', 'Corrosion', NULL),
  ('DMG', 'Handling damage', 'Dents, bent or lifted laminations, chipped edges'),
  ('PKG', 'Packaging or labelling', NULL),
  ('DOC', 'Paperwork missing or wrong', 'Certificate of conformance, heat or coil numbers'),
  ('MAT', 'Wrong steel grade or heat', NULL)
ON CONFLICT ("code") DO NOTHING;
