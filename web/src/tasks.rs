//! Long work in slices that give the browser back its thread between them.
//!
//! [`next_task`] runs a callback in a new task, queued behind what the
//! browser already has (input events, and a frame's painting when one is
//! due), through a `MessageChannel`: a message posted to a port is handled
//! as a task of its own, without the clamping of `setTimeout` (4 ms after a
//! few nested calls) and without waiting for the next frame, as an
//! animation-frame callback does. A job that computes for a few
//! milliseconds per slice and then calls `next_task` for the next one uses
//! the time between frames too, and a keystroke waits at most one slice.

use std::cell::RefCell;
use std::collections::VecDeque;
use std::rc::Rc;
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};

type Task = Box<dyn FnOnce()>;

/// One channel for the page: its port's handler runs the oldest queued
/// callback for each message.
struct Channel {
    channel: web_sys::MessageChannel,
    queue: Rc<RefCell<VecDeque<Task>>>,
    _on_message: Closure<dyn FnMut()>,
}

impl Channel {
    fn new() -> Option<Channel> {
        let channel = web_sys::MessageChannel::new().ok()?;
        let queue: Rc<RefCell<VecDeque<Task>>> = Rc::default();
        let q = queue.clone();
        let on_message = Closure::<dyn FnMut()>::new(move || {
            // Taken out first: the callback may queue the next one.
            let next = q.borrow_mut().pop_front();
            if let Some(f) = next {
                f();
            }
        });
        channel.port1().set_onmessage(Some(on_message.as_ref().unchecked_ref()));
        Some(Channel { channel, queue, _on_message: on_message })
    }
}

thread_local! {
    static CHANNEL: Option<Channel> = Channel::new();
}

/// Runs `f` in a new task as soon as the browser has handled what is
/// already queued; in the next animation frame if the page cannot post
/// messages.
pub fn next_task(f: impl FnOnce() + 'static) {
    let f: Task = Box::new(f);
    let refused = CHANNEL.with(|c| match c {
        Some(c) => {
            c.queue.borrow_mut().push_back(f);
            if c.channel.port2().post_message(&JsValue::NULL).is_ok() {
                None
            } else {
                c.queue.borrow_mut().pop_back()
            }
        }
        None => Some(f),
    });
    if let Some(f) = refused {
        leptos::prelude::request_animation_frame(f);
    }
}
