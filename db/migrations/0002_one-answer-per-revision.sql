-- Earlier answers through one link to one revision: keep the first, as the customer saw it, before the rule.
DELETE FROM "approvals" a USING "approvals" b WHERE a."share_link_id" = b."share_link_id" AND a."revision" = b."revision" AND (a."created_at", a."id") > (b."created_at", b."id");--> statement-breakpoint
CREATE UNIQUE INDEX "approvals_share_link_id_revision_index" ON "approvals" USING btree ("share_link_id","revision");
