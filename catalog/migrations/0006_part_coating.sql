-- A part's anti-reflection coating: the residual reflectance of each of
-- its surfaces that borders air, percent at normal incidence (NULL = not
-- stated: the ghost-focus estimates then take the Fresnel value from the
-- indices). See optics.Coating. Not carried in the search index: only the
-- ghost figures use it, and they are worked out from the full prescriptions
-- read for the layouts a search shows.
ALTER TABLE parts ADD COLUMN residual_reflectance_pct REAL
    CHECK (residual_reflectance_pct >= 0 AND residual_reflectance_pct <= 100);
