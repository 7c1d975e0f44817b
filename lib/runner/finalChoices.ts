/**
 * The final questionnaire's choices, as the runner offers them and the server accepts them
 * (lib/runner/questionnaire.ts). A module without imports, so the participant page takes only this.
 */
export const FINAL_CHOICES = {
  age_band: ["18–24", "25–34", "35–44", "45–54", "55–64", "65 or older", "prefer not to say"],
  handedness: ["left", "right", "both", "prefer not to say"],
  experience: ["never", "sometimes", "often"],
} as const;

/** The longest free-text comment the final questionnaire takes (characters). */
export const MAX_COMMENT_CHARS = 2000;
