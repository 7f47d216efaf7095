/**
 * SQL that fills an empty, migrated database with `n` realistic spectra in a few statements
 * (INSERT … SELECT over generate_series, no round trip per row): 4 groups of 5 people, 12
 * projects per group, a sample per 25 spectra (five core materials), ten years of uploads, one
 * finished analysis per readable spectrum with three peaks and one flag, a decision on two flags
 * in three, and five audit events per spectrum. Ids are md5-derived UUIDs (uuidOf) so re-runs agree.
 * One spectrum in a hundred could not be read (no analysis).
 */
export const SCALE_GROUPS = 4;
export const SCALE_PROJECTS_PER_GROUP = 12;
export const SPECTRA_PER_SAMPLE = 25;
export const SCALE_PASSWORD = "bandkeep-scale";

/** A version-4-shaped UUID from md5 of the text (ids that validators of UUIDs accept). */
const uuidOf = (text: string) => `overlay(overlay(md5(${text}) placing '4' from 13) placing '8' from 17)::uuid`;

export function scaleSeedSql(n: number, passwordHash: string): string[] {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a positive whole number, got ${n}`);
  const samples = Math.ceil(n / SPECTRA_PER_SAMPLE);
  const stepSeconds = (10 * 365.25 * 86400) / n;
  const G = SCALE_GROUPS;
  const P = SCALE_PROJECTS_PER_GROUP;
  const hash = passwordHash.replace(/'/g, "''");
  // spectrum i belongs to sample ((i-1)/25)+1; sample j to group (j % G)+1 and project ((j / G) % P)+1 of it
  const sampleOf = (i: string) => `((${i} - 1) / ${SPECTRA_PER_SAMPLE} + 1)`;
  const groupOf = (j: string) => `(${j} % ${G} + 1)`;
  const projectOf = (j: string) => uuidOf(`'p' || ${groupOf(j)} || '-' || ((${j} / ${G}) % ${P} + 1)`);
  return [
    `INSERT INTO groups (id, name, slug) SELECT ${uuidOf(`'g' || g`)}, 'Scale group ' || g, 'scale-g' || g FROM generate_series(1, ${G}) g`,
    `INSERT INTO users (id, email, name, password_hash)
       SELECT ${uuidOf(`'u' || g || '-' || k`)}, (CASE k WHEN 1 THEN 'lead' WHEN 2 THEN 'steward' ELSE 'spectro' || k END) || '@scale-g' || g || '.test',
              'Scale person ' || g || '.' || k, '${hash}'
       FROM generate_series(1, ${G}) g, generate_series(1, 5) k`,
    `INSERT INTO memberships (group_id, user_id, role)
       SELECT ${uuidOf(`'g' || g`)}, ${uuidOf(`'u' || g || '-' || k`)},
              (CASE k WHEN 1 THEN 'lead' WHEN 2 THEN 'steward' ELSE 'spectroscopist' END)::member_role
       FROM generate_series(1, ${G}) g, generate_series(1, 5) k`,
    `INSERT INTO projects (id, group_id, name)
       SELECT ${uuidOf(`'p' || g || '-' || k`)}, ${uuidOf(`'g' || g`)}, 'Scale project ' || g || '.' || k
       FROM generate_series(1, ${G}) g, generate_series(1, ${P}) k`,
    `INSERT INTO samples (id, group_id, project_id, name, material, notes, created_at)
       SELECT ${uuidOf(`'m' || j`)}, ${uuidOf(`'g' || ${groupOf("j")}`)}, ${projectOf("j")},
              'QD-' || (ARRAY['CdSe','CdTe','CdS','PbS','PbSe'])[j % 5 + 1] || '-' || j,
              (ARRAY['CdSe','CdTe','CdS','PbS','PbSe'])[j % 5 + 1],
              (ARRAY['hot injection, oleic acid', 'heat-up, oleylamine', 'cation exchange', 'shell growth, SILAR', 'ligand exchange to MPA'])[j % 5 + 1],
              timestamptz '2016-01-01' + ((j - 1) * ${SPECTRA_PER_SAMPLE} * ${stepSeconds}) * interval '1 second'
       FROM generate_series(1, ${samples}) j`,
    `INSERT INTO spectra (id, project_id, sample_id, technique, file_name, object_key, sha256, size_bytes, metadata, status, material,
                          error_message, uploaded_by, created_at, updated_at)
       SELECT ${uuidOf(`'s' || i`)}, ${projectOf(sampleOf("i"))}, ${uuidOf(`'m' || ${sampleOf("i")}`)},
              (CASE WHEN i % 10 < 7 THEN 'absorption' WHEN i % 10 < 9 THEN 'pl' ELSE 'ir' END)::text,
              'batch-' || ${sampleOf("i")} || '-' || (CASE WHEN i % 10 < 7 THEN 'abs' WHEN i % 10 < 9 THEN 'pl' ELSE 'ir' END) || '-' || i || '.csv',
              'scale/' || i, md5('s' || i) || md5('t' || i), 20000 + i % 5000,
              jsonb_build_object('instrument', (ARRAY['bench UV-Vis', 'fibre spectrometer', 'FTIR'])[i % 3 + 1], 'operator_note', 'aliquot ' || (i % 40)),
              (CASE WHEN i % 100 = 0 THEN 'failed' ELSE 'analysed' END)::spectrum_status,
              (ARRAY['CdSe','CdTe','CdS','PbS','PbSe'])[${sampleOf("i")} % 5 + 1],
              CASE WHEN i % 100 = 0 THEN 'line 3: no numeric columns' END,
              ${uuidOf(`'u' || ${groupOf(sampleOf("i"))} || '-' || (i % 3 + 3)`)},
              timestamptz '2016-01-01' + ((i - 1) * ${stepSeconds}) * interval '1 second',
              timestamptz '2016-01-01' + ((i - 1) * ${stepSeconds}) * interval '1 second'
       FROM generate_series(1, ${n}) i`,
    `INSERT INTO analysis_runs (id, spectrum_id, engine_version, parameter_hash, status, report, noise, created_at, updated_at, finished_at)
       SELECT ${uuidOf(`'r' || i`)}, ${uuidOf(`'s' || i`)}, 'scale', md5('r' || i) || md5('q' || i), 'done',
              jsonb_build_object('derived', jsonb_build_object('diameterNm', round((2 + (i * 37 % 600) / 100.0)::numeric, 2))),
              0.001, s.created_at + interval '1 minute', s.created_at + interval '1 minute', s.created_at + interval '1 minute'
       FROM generate_series(1, ${n}) i JOIN spectra s ON s.id = ${uuidOf(`'s' || i`)}
       WHERE i % 100 <> 0`,
    // three peaks: absorption's first exciton and two higher transitions; PL's maximum and two shoulders; IR's C-H, C=O, C-H bend
    `INSERT INTO peaks (run_id, energy_ev, wavelength_nm, height, fwhm_mev, is_first_exciton)
       SELECT ${uuidOf(`'r' || i`)}, 1239.841984 / w.nm, w.nm, w.h, 80, w.first
       FROM generate_series(1, ${n}) i,
            LATERAL (SELECT 450 + (i::bigint * 7919 % 250) AS base) b,
            LATERAL (VALUES
              (CASE WHEN i % 10 < 7 THEN b.base WHEN i % 10 < 9 THEN b.base + 25 ELSE 1e7 / (2900 + i % 50) END, CASE WHEN i % 10 < 9 THEN 0.5 ELSE 0.4 END, i % 10 < 7),
              (CASE WHEN i % 10 < 7 THEN b.base - 80 WHEN i % 10 < 9 THEN b.base + 60 ELSE 1e7 / (1700 + i % 30) END, 0.2, false),
              (CASE WHEN i % 10 < 7 THEN b.base - 150 WHEN i % 10 < 9 THEN b.base - 20 ELSE 1e7 / (1440 + i % 20) END, 0.1, false)
            ) AS w(nm, h, first)
       WHERE i % 100 <> 0`,
    `INSERT INTO signatures (id, run_id, spectrum_id, kind, energy_ev, fraction, significance, details, review_state, created_at, updated_at)
       SELECT ${uuidOf(`'f' || i`)}, ${uuidOf(`'r' || i`)}, ${uuidOf(`'s' || i`)},
              (ARRAY['bleach','new-band','pl-quench','shift','broadening'])[i % 5 + 1]::text, 2.1,
              (i % 50) / 100.0, (i % 40) + 0.5, jsonb_build_object('magnitude', (i % 50) / 100.0, 'message', 'scale row'),
              (ARRAY['awaiting','confirmed','dismissed'])[i % 3 + 1]::review_state,
              s.created_at + interval '1 minute', s.created_at + interval '1 minute'
       FROM generate_series(1, ${n}) i JOIN spectra s ON s.id = ${uuidOf(`'s' || i`)}
       WHERE i % 100 <> 0`,
    `INSERT INTO reviews (signature_id, reviewer_id, decision, comment, created_at)
       SELECT ${uuidOf(`'f' || i`)}, ${uuidOf(`'u' || ${groupOf(sampleOf("i"))} || '-1'`)},
              (ARRAY['confirmed','dismissed'])[i % 3]::review_state, '', now()
       FROM generate_series(1, ${n}) i WHERE i % 100 <> 0 AND i % 3 <> 0`,
    `INSERT INTO audit_events (at, actor_id, actor_label, group_id, action, target_type, target_id, details)
       SELECT s.created_at + k * interval '1 minute', s.uploaded_by, 'scale', ${uuidOf(`'g' || ${groupOf(sampleOf("i"))}`)},
              (ARRAY['spectrum.upload','analysis.request','signatures-superseded','signature-decided','exported'])[k + 1],
              'spectrum', s.id::text, '{}'
       FROM generate_series(1, ${n}) i JOIN spectra s ON s.id = ${uuidOf(`'s' || i`)}, generate_series(0, 4) k`,
    "VACUUM ANALYZE",
  ];
}
