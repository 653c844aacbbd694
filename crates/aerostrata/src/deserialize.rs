//! Deserialisation through the constructors (the `serde` feature): a type whose values
//! must be checked reads as a shadow struct of the fields it serialises and becomes
//! itself only through the constructor that checks them, so that a deserialised value
//! passes the same checks as a built one. A refusal is the deserialiser's error, with
//! the constructor's message.

/// Writes, for a type that derives only `Serialize`, the shadow struct of its serialised
/// fields, the shadow's `TryFrom` into the type, and the type's `Deserialize` through it
/// (what serde's `try_from` attribute would write). The build expression, the
/// constructor's call, sees the fields by name.
///
/// ```text
/// deserialize_through! {
///     /// What deserialisation reads before [`Isothermal::new`] validates it.
///     IsothermalParameters { temperature_k: f64, sea_level_pressure_pa: f64 } => Isothermal,
///     Isothermal::new(temperature_k, sea_level_pressure_pa)
/// }
/// ```
macro_rules! deserialize_through {
    (
        $(#[$doc:meta])*
        $shadow:ident $(<$param:ident: $bound:path>)? { $($field:ident: $type:ty),* $(,)? } => $target:ty,
        $build:expr $(,)?
    ) => {
        $(#[$doc])*
        #[cfg(feature = "serde")]
        #[derive(serde::Deserialize)]
        struct $shadow $(<$param>)? {
            $($field: $type),*
        }

        #[cfg(feature = "serde")]
        impl $(<$param: $bound>)? TryFrom<$shadow $(<$param>)?> for $target {
            type Error = crate::Error;
            fn try_from(parts: $shadow $(<$param>)?) -> crate::Result<Self> {
                let $shadow { $($field),* } = parts;
                $build
            }
        }

        #[cfg(feature = "serde")]
        impl<'de $(, $param: $bound + serde::Deserialize<'de>)?> serde::Deserialize<'de> for $target {
            fn deserialize<D>(deserializer: D) -> core::result::Result<Self, D::Error>
            where
                D: serde::Deserializer<'de>,
            {
                let parts = <$shadow $(<$param>)? as serde::Deserialize>::deserialize(deserializer)?;
                Self::try_from(parts).map_err(serde::de::Error::custom)
            }
        }
    };
}
