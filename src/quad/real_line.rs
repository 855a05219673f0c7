//! (placeholder: this method is being moved here from its task file)
