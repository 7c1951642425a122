-- Designs saved from a preset become the one-pickup layout with the preset's options (the same network).
UPDATE `harnesses` SET `options` = CASE `preset`
  WHEN 'interactive-tone' THEN '{"toneWiring":"interactive"}'
  WHEN 'bleed-cap' THEN '{"bleed":"cap"}'
  WHEN 'bleed-cap-parallel-r' THEN '{"bleed":"cap-parallel-r"}'
  WHEN 'bleed-cap-series-r' THEN '{"bleed":"cap-series-r"}'
  WHEN 'tone-floor-resistor' THEN '{"toneNetwork":"floor-resistor"}'
  WHEN 'dual-cap-tone' THEN '{"toneNetwork":"floor-and-second-cap"}'
  ELSE '{}' END,
  `layout` = 'one-pickup', `selector` = 0;
