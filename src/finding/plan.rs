//! Finding codes about a separation plan.

use super::finding_codes;

finding_codes! {
    /// Every finding a plan can raise.
    pub enum PlanCode {
        /// The pot limit lies above a component's normal boiling point.
        MaxPotAboveNormalBoiling = "max-pot-above-normal-boiling", Info;
        /// A curve is used outside its stated validity range.
        OutsideValidRange = "outside-valid-range", Warning;
        /// A component's curve carries no stated uncertainty.
        UncertaintyNotStated = "uncertainty-not-stated", Info;
        /// The condensate needs a cold trap at this pressure.
        CondensateNeedsColdTrap = "condensate-needs-cold-trap", Warning;
        /// Only the key pair was analysed.
        KeyPairOnly = "key-pair-only", Info;
        /// No activity model could be built for the key pair; Raoult's law was used.
        IdealSolutionAssumed = "ideal-solution-assumed", Warning;
        /// The rule of thumb and the stage count disagree.
        RuleOfThumbDisagrees = "rule-of-thumb-disagrees", Info;
    }
}
