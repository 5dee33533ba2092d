//! localStorage behind the store's [`Backend`] interface, and the two other
//! browser calls the history makes (persistence, downloads).
//!
//! Plain `web_sys::Storage`, with every exception caught: a browser that
//! blocks storage throws on `window.localStorage` itself and on any call,
//! and the app must run on regardless (for this session only). gloo-storage's
//! typed `get`/`set` panic there (`expect_throw`), and with its raw handle
//! it adds nothing to these calls.

use super::error::StoreError;
use super::store::Backend;
use wasm_bindgen::JsValue;

pub struct Browser {
    storage: Option<web_sys::Storage>,
}

impl Browser {
    pub fn open() -> Browser {
        Browser {
            storage: web_sys::window().and_then(|w| w.local_storage().ok().flatten()),
        }
    }
}

/// A full quota, or anything else the browser refused.
fn fault(err: JsValue) -> StoreError {
    let name = js_sys::Reflect::get(&err, &JsValue::from_str("name"))
        .ok()
        .and_then(|n| n.as_string())
        .unwrap_or_default();
    if name == "QuotaExceededError" || name == "NS_ERROR_DOM_QUOTA_REACHED" {
        StoreError::Full
    } else {
        StoreError::Refused
    }
}

impl Backend for Browser {
    fn read(&self, key: &str) -> Result<Option<String>, StoreError> {
        self.storage
            .as_ref()
            .ok_or(StoreError::Unavailable)?
            .get_item(key)
            .map_err(fault)
    }

    fn write(&mut self, key: &str, value: &str) -> Result<(), StoreError> {
        self.storage
            .as_ref()
            .ok_or(StoreError::Refused)?
            .set_item(key, value)
            .map_err(fault)
    }

    fn remove(&mut self, key: &str) {
        if let Some(s) = &self.storage {
            let _ = s.remove_item(key);
        }
    }

    fn keys(&self) -> Vec<String> {
        let Some(s) = &self.storage else { return Vec::new() };
        let n = s.length().unwrap_or(0);
        (0..n).filter_map(|i| s.key(i).ok().flatten()).collect()
    }
}

/// Asks the browser to keep this site's storage (no prompt in most browsers).
pub fn ask_persistence() {
    let Some(w) = web_sys::window() else { return };
    let nav = w.navigator();
    let has = js_sys::Reflect::get(&nav, &JsValue::from_str("storage"))
        .map(|s| !s.is_undefined())
        .unwrap_or(false);
    if has {
        let _ = nav.storage().persist();
    }
}

/// Offers `text` as a file download.
pub fn download(name: &str, mime: &str, text: &str) -> bool {
    use wasm_bindgen::JsCast;
    let parts = js_sys::Array::of1(&JsValue::from_str(text));
    let opts = web_sys::BlobPropertyBag::new();
    opts.set_type(mime);
    let Ok(blob) = web_sys::Blob::new_with_str_sequence_and_options(&parts, &opts) else {
        return false;
    };
    let Ok(url) = web_sys::Url::create_object_url_with_blob(&blob) else {
        return false;
    };
    let doc = leptos::prelude::document();
    let Some(a) = doc
        .create_element("a")
        .ok()
        .and_then(|a| a.dyn_into::<web_sys::HtmlAnchorElement>().ok())
    else {
        return false;
    };
    a.set_href(&url);
    a.set_download(name);
    a.click();
    let _ = web_sys::Url::revoke_object_url(&url);
    true
}
